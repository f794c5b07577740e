import { Router } from 'express';
import { z } from 'zod';
import { auditorFor } from '#server/http/audit.ts';
import type { ApiContext } from '#server/http/context.ts';
import { permit } from '#server/http/roles.ts';
import { actorOf } from '#server/http/session.ts';
import { parseBody, parseParams, parseQuery } from '#server/http/validate.ts';
import { uuidSchema } from '#shared/schemas/common.ts';
import { createSpecimenSchema, labelQuerySchema, updateSpecimenSchema } from '#shared/schemas/specimens.ts';
import { addSpecimen, changeSpecimen, specimenLabel, specimensOfCase } from './service.ts';

const caseParams = z.object({ id: uuidSchema });
const specimenParams = z.object({ id: uuidSchema, specimenId: uuidSchema });
const labelParams = specimenParams.extend({ format: z.enum(['png', 'pdf']) });

/** Specimens: read by every role of the unit; written by nurses and endoscopists while the record is open. */
export function specimensRouter(ctx: ApiContext): Router {
  const router = Router();
  const { db, authenticate } = ctx;
  router.get('/cases/:id/specimens', authenticate, permit('case.view'), async (req, res) => {
    const { id } = parseParams(caseParams, req);
    res.json({ specimens: await specimensOfCase(db, actorOf(req), id, auditorFor(req)) });
  });
  router.post('/cases/:id/specimens', authenticate, permit('event.record'), async (req, res) => {
    const { id } = parseParams(caseParams, req);
    const { specimen, created } = await addSpecimen(db, actorOf(req), id, parseBody(createSpecimenSchema, req), auditorFor(req));
    res.status(created ? 201 : 200).json(specimen);
  });
  router.patch('/cases/:id/specimens/:specimenId', authenticate, permit('event.record'), async (req, res) => {
    const { id, specimenId } = parseParams(specimenParams, req);
    res.json(await changeSpecimen(db, actorOf(req), id, specimenId, parseBody(updateSpecimenSchema, req), auditorFor(req)));
  });
  router.get('/cases/:id/specimens/:specimenId/label.:format', authenticate, permit('event.record'), async (req, res) => {
    const { id, specimenId, format } = parseParams(labelParams, req);
    const { symbology } = parseQuery(labelQuerySchema, req);
    const file = await specimenLabel(db, actorOf(req), id, specimenId, format, symbology, auditorFor(req));
    res.type(format === 'png' ? 'image/png' : 'application/pdf')
      .set('Content-Disposition', `inline; filename="specimen-${specimenId.slice(0, 8)}.${format}"`)
      .set('Cache-Control', 'private, no-store')
      .send(file);
  });
  return router;
}
