import { Router } from 'express';
import type { ApiContext } from '#server/http/context.ts';
import { permit } from '#server/http/roles.ts';
import { actorOf } from '#server/http/session.ts';
import { parseQuery } from '#server/http/validate.ts';
import { auditQuerySchema } from '#shared/schemas/api-audit.ts';
import { auditPage } from './service.ts';

export function auditRouter(ctx: ApiContext): Router {
  const router = Router();
  router.get('/audit', ctx.authenticate, permit('audit.view'), async (req, res) => {
    const query = parseQuery(auditQuerySchema, req);
    res.json(await auditPage(ctx.db, actorOf(req).unitId, query));
  });
  return router;
}
