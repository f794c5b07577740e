import { z } from 'zod';
import { caseSummarySchema } from './cases.ts';

/** GET /api/patients?hospitalNumber= — look a patient up in the unit, to fill the schedule form. Audited. */
export const findPatientQuerySchema = z.object({
  hospitalNumber: z.string().trim().min(1, 'Hospital number is required').max(32),
});

export const patientSchema = caseSummarySchema.shape.patient;
export type Patient = z.infer<typeof patientSchema>;
