import { z } from 'zod';
import { isoDateSchema, isoDateTimeSchema, roleSchema, uuidSchema } from './common.ts';

export const procedureTypes = ['emr', 'esd', 'eftr', 'other'] as const;
export const procedureTypeSchema = z.enum(procedureTypes);
export type ProcedureType = z.infer<typeof procedureTypeSchema>;
export const procedureTypeLabels: Record<ProcedureType, string> = {
  emr: 'EMR — endoscopic mucosal resection',
  esd: 'ESD — endoscopic submucosal dissection',
  eftr: 'EFTR — endoscopic full-thickness resection',
  other: 'Other therapeutic procedure',
};

export const sedationTypes = ['moderate', 'deep', 'general_anaesthesia'] as const;
export const sedationTypeSchema = z.enum(sedationTypes);
export type SedationType = z.infer<typeof sedationTypeSchema>;
export const sedationTypeLabels: Record<SedationType, string> = {
  moderate: 'Moderate sedation',
  deep: 'Deep sedation',
  general_anaesthesia: 'General anaesthesia',
};

/**
 * Paris classification of superficial neoplastic lesions (Paris Workshop, Gastrointest Endosc 2003;58:S3–S43):
 * protruded 0-Ip, 0-Isp, 0-Is; flat 0-IIa, 0-IIb, 0-IIc; excavated 0-III; mixed types written dominant first.
 * `not_applicable` for lesions the classification does not cover (a submucosal tumour, say).
 */
export const parisTypes = [
  '0-Ip', '0-Isp', '0-Is', '0-IIa', '0-IIb', '0-IIc', '0-III',
  '0-IIa+IIc', '0-IIc+IIa', '0-IIa+Is', '0-Is+IIa', '0-IIc+III', '0-III+IIc',
  'not_applicable',
] as const;
export const parisTypeSchema = z.enum(parisTypes);
export type ParisType = z.infer<typeof parisTypeSchema>;

export const sexes = ['female', 'male', 'other', 'unknown'] as const;
export const sexSchema = z.enum(sexes);

/**
 * Case lifecycle. scheduled → recording (first event) → closed (sign-out) → reported (report signed);
 * cancelled from scheduled only. Our own names.
 */
export const caseStatuses = ['scheduled', 'recording', 'closed', 'reported', 'cancelled'] as const;
export const caseStatusSchema = z.enum(caseStatuses);
export type CaseStatus = z.infer<typeof caseStatusSchema>;

export const patientInputSchema = z.object({
  /** Hospital number (medical record number), as printed on the wristband. */
  hospitalNumber: z.string().trim().min(1, 'Hospital number is required').max(32),
  familyName: z.string().trim().min(1, 'Family name is required').max(100),
  givenName: z.string().trim().min(1, 'Given name is required').max(100),
  /** Date of birth; not in the future. */
  birthDate: isoDateSchema.refine((d) => d <= new Date().toISOString().slice(0, 10), 'Date of birth is in the future'),
  sex: sexSchema,
});
export type PatientInput = z.infer<typeof patientInputSchema>;

export const lesionInputSchema = z.object({
  /** Site in words, e.g. "gastric antrum, greater curvature". */
  site: z.string().trim().min(1, 'Lesion site is required').max(120),
  /** Largest diameter, millimetres (endoscopic estimate). */
  sizeMm: z.number().int('Whole millimetres').min(1, 'At least 1 mm').max(300, 'At most 300 mm'),
  paris: parisTypeSchema,
});
export type LesionInput = z.infer<typeof lesionInputSchema>;

/** POST /api/cases — schedule a case. Used by the form, the route and the tests. */
export const scheduleCaseSchema = z.object({
  /**
   * The case's id, made by the tablet once per form: a repeat of the request (its answer lost, the
   * button pressed again) answers the case it made instead of scheduling a second one.
   */
  id: uuidSchema.optional(),
  patient: patientInputSchema,
  procedureType: procedureTypeSchema,
  indication: z.string().trim().min(1, 'Indication is required').max(500),
  lesion: lesionInputSchema,
  roomId: uuidSchema,
  /** Planned start, ISO date-time. */
  scheduledAt: isoDateTimeSchema,
  sedation: sedationTypeSchema,
  /** The endoscopist who performs the case (a user id, member of the unit as endoscopist). */
  endoscopistId: z.string().min(1, 'Choose the endoscopist'),
  /** The assisting nurse (a user id, member of the unit as nurse). */
  nurseId: z.string().min(1, 'Choose the nurse'),
});
export type ScheduleCaseInput = z.infer<typeof scheduleCaseSchema>;

/** GET /api/cases query. */
export const listCasesQuerySchema = z.object({
  /** The day, YYYY-MM-DD, in the unit's local calendar; default today. */
  date: isoDateSchema.optional(),
  roomId: uuidSchema.optional(),
  status: caseStatusSchema.optional(),
});

export const roomSchema = z.object({ id: uuidSchema, name: z.string(), unitId: uuidSchema });
export type Room = z.infer<typeof roomSchema>;

export const memberSchema = z.object({ userId: z.string(), name: z.string(), email: z.string(), role: roleSchema });
export type Member = z.infer<typeof memberSchema>;

export const caseSummarySchema = z.object({
  id: uuidSchema,
  unitId: uuidSchema,
  status: caseStatusSchema,
  procedureType: procedureTypeSchema,
  scheduledAt: isoDateTimeSchema,
  room: roomSchema,
  patient: z.object({ id: uuidSchema, hospitalNumber: z.string(), familyName: z.string(), givenName: z.string(), birthDate: isoDateSchema, sex: sexSchema }),
  indication: z.string(),
  lesion: lesionInputSchema,
  sedation: sedationTypeSchema,
  endoscopist: z.object({ id: z.string(), name: z.string() }),
  nurse: z.object({ id: z.string(), name: z.string() }),
});
export type CaseSummary = z.infer<typeof caseSummarySchema>;
