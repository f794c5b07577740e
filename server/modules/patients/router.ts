import { Router } from 'express';
import { audit } from '#server/http/audit.ts';
import type { ApiContext } from '#server/http/context.ts';
import { permit } from '#server/http/roles.ts';
import { actorOf } from '#server/http/session.ts';
import { parseQuery } from '#server/http/validate.ts';
import { findPatientQuerySchema } from '#shared/schemas/api-patients.ts';
import { findPatient } from './service.ts';

export function patientsRouter(ctx: ApiContext): Router {
  const router = Router();
  // The schedule form's look-up by hospital number; a found patient's identity is an audited view.
  router.get('/patients', ctx.authenticate, permit('case.schedule'), async (req, res) => {
    const { hospitalNumber } = parseQuery(findPatientQuerySchema, req);
    const patient = await findPatient(ctx.db, actorOf(req).unitId, hospitalNumber);
    await audit(ctx.db, req, { action: 'patient.view', entityType: 'patient', entityId: patient.id });
    res.json(patient);
  });
  return router;
}
