import { Router } from 'express';
import { z } from 'zod';
import { auditorFor } from '#server/http/audit.ts';
import type { ApiContext } from '#server/http/context.ts';
import { permit } from '#server/http/roles.ts';
import { actorOf } from '#server/http/session.ts';
import { parseBody, parseParams } from '#server/http/validate.ts';
import { uuidSchema } from '#shared/schemas/common.ts';
import { createDeviceUsageSchema } from '#shared/schemas/device-usages.ts';
import { recordUsage, usagesOfCase } from './service.ts';

const caseParams = z.object({ id: uuidSchema });

/** Devices used in a case with their lots: read by the unit; written by nurses and endoscopists while the record is open. */
export function deviceUsagesRouter(ctx: ApiContext): Router {
  const router = Router();
  const { db, authenticate } = ctx;
  router.get('/cases/:id/device-usages', authenticate, permit('case.view'), async (req, res) => {
    const { id } = parseParams(caseParams, req);
    res.json({ usages: await usagesOfCase(db, actorOf(req), id) });
  });
  router.post('/cases/:id/device-usages', authenticate, permit('event.record'), async (req, res) => {
    const { id } = parseParams(caseParams, req);
    const { usage, created } = await recordUsage(db, actorOf(req), id, parseBody(createDeviceUsageSchema, req), auditorFor(req));
    res.status(created ? 201 : 200).json(usage);
  });
  return router;
}
