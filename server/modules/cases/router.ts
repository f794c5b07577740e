import { Router } from 'express';
import { auditorFor } from '#server/http/audit.ts';
import type { ApiContext } from '#server/http/context.ts';
import { permit } from '#server/http/roles.ts';
import { actorOf } from '#server/http/session.ts';
import { parseBody, parseParams, parseQuery } from '#server/http/validate.ts';
import { cancelCaseSchema, caseIdParamsSchema } from '#shared/schemas/api-cases.ts';
import { listCasesQuerySchema, scheduleCaseSchema } from '#shared/schemas/cases.ts';
import { cancelCase, getCase, listCases, scheduleCase } from './service.ts';

export function casesRouter(ctx: ApiContext): Router {
  const router = Router();
  const { db, authenticate } = ctx;

  router.get('/cases', authenticate, permit('case.view'), async (req, res) => {
    res.json(await listCases(db, actorOf(req), parseQuery(listCasesQuerySchema, req), auditorFor(req)));
  });
  router.post('/cases', authenticate, permit('case.schedule'), async (req, res) => {
    const { summary, created } = await scheduleCase(db, actorOf(req), parseBody(scheduleCaseSchema, req), auditorFor(req));
    res.status(created ? 201 : 200).json(summary);
  });
  router.get('/cases/:id', authenticate, permit('case.view'), async (req, res) => {
    const { id } = parseParams(caseIdParamsSchema, req);
    res.json(await getCase(db, actorOf(req), id, auditorFor(req)));
  });
  router.post('/cases/:id/cancel', authenticate, permit('case.cancel'), async (req, res) => {
    const { id } = parseParams(caseIdParamsSchema, req);
    const input = parseBody(cancelCaseSchema, req);
    res.json(await cancelCase(db, actorOf(req), id, input, auditorFor(req)));
  });
  return router;
}
