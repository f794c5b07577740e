import { Router } from 'express';
import type { ApiContext } from '#server/http/context.ts';
import { permit } from '#server/http/roles.ts';
import { actorOf } from '#server/http/session.ts';
import type { Room } from '#shared/schemas/cases.ts';
import { listRooms } from './queries.ts';

export function roomsRouter(ctx: ApiContext): Router {
  const router = Router();
  router.get('/rooms', ctx.authenticate, permit('case.view'), async (req, res) => {
    const rooms: Room[] = await listRooms(ctx.db, actorOf(req).unitId);
    res.json(rooms);
  });
  return router;
}
