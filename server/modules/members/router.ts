import { Router } from 'express';
import type { ApiContext } from '#server/http/context.ts';
import { permit } from '#server/http/roles.ts';
import { actorOf } from '#server/http/session.ts';
import { parseQuery } from '#server/http/validate.ts';
import { listMembersQuerySchema } from '#shared/schemas/api-members.ts';
import type { Me } from '#shared/schemas/session.ts';
import { unitMembers } from './service.ts';

export function membersRouter(ctx: ApiContext): Router {
  const router = Router();
  // Who am I: any signed-in member of a unit (401 / 403 from authenticate otherwise).
  router.get('/me', ctx.authenticate, (req, res) => {
    const a = actorOf(req);
    const me: Me = { user: { id: a.userId, name: a.name, email: a.email }, unit: { id: a.unitId, name: a.unitName, hospital: a.hospital }, role: a.role };
    res.json(me);
  });
  router.get('/members', ctx.authenticate, permit('case.view'), async (req, res) => {
    const { role } = parseQuery(listMembersQuerySchema, req);
    res.json(await unitMembers(ctx.db, actorOf(req).unitId, role));
  });
  return router;
}
