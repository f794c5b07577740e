import { Router } from 'express';
import { z } from 'zod';
import { auditorFor } from '#server/http/audit.ts';
import type { ApiContext } from '#server/http/context.ts';
import { permit } from '#server/http/roles.ts';
import { actorOf } from '#server/http/session.ts';
import { parseParams } from '#server/http/validate.ts';
import { uuidSchema } from '#shared/schemas/common.ts';
import { recordOf, recordPdfOf } from './service.ts';

const caseParams = z.object({ id: uuidSchema });

/** The record of a case, as JSON for the page and as PDF for the chart: readable by every role of the unit. */
export function recordRouter(ctx: ApiContext): Router {
  const router = Router();
  const { db, authenticate } = ctx;
  router.get('/cases/:id/record', authenticate, permit('case.view'), async (req, res) => {
    const { id } = parseParams(caseParams, req);
    res.set('Cache-Control', 'private, no-store').json(await recordOf(db, actorOf(req), id, auditorFor(req)));
  });
  router.get('/cases/:id/record.pdf', authenticate, permit('case.view'), async (req, res) => {
    const { id } = parseParams(caseParams, req);
    const pdf = await recordPdfOf(db, actorOf(req), id, auditorFor(req));
    res.type('application/pdf')
      .set('Content-Disposition', `inline; filename="record-${id.slice(0, 8)}.pdf"`)
      .set('Cache-Control', 'private, no-store')
      .send(pdf);
  });
  return router;
}
