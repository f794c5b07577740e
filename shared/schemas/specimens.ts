import { z } from 'zod';
import { retrievalMethods } from './events.ts';
import { uuidSchema } from './common.ts';

/**
 * Specimens of a case, from the moment one comes out to its hand-off to the laboratory. A specimen's id
 * may be made on the tablet, so the `specimen_retrieved` and `specimen_labelled` events can name it
 * (`specimenId`) before the list on the server knows it.
 */
export const retrievalMethodSchema = z.enum(retrievalMethods);
export const retrievalMethodLabels: Record<(typeof retrievalMethods)[number], string> = {
  net: 'Net', basket: 'Basket', snare: 'Snare', cap_suction: 'Cap suction',
};

/** Where a specimen is on its way to the laboratory (our own words). */
export const handoffStatuses = ['pending', 'labelled', 'handed_over', 'received'] as const;
export const handoffStatusSchema = z.enum(handoffStatuses);
export type HandoffStatus = z.infer<typeof handoffStatusSchema>;
export const handoffStatusLabels: Record<HandoffStatus, string> = {
  pending: 'In the room, not yet labelled',
  labelled: 'Labelled, in the room',
  handed_over: 'Handed over for the laboratory',
  received: 'Received by the laboratory',
};

const blankToNull = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? null : v);
// From 0.1 mm, a ruler's finest reading (common practice); far smaller values also fall outside the column's float4 range.
const mm = z.number().min(0.1, 'At least 0.1 mm').max(1000, 'At most 1000 mm');

const fields = {
  /** The team's name for the specimen, as written on the container ("A", "B — margin"). */
  label: z.string().trim().min(1, 'Label is required').max(60, 'At most 60 characters'),
  retrievalMethod: retrievalMethodSchema.nullable().optional(),
  pieces: z.number().int('Whole pieces').min(1, 'At least 1 piece').max(1000).nullable().optional(),
  /** Long and short axis of the pinned specimen, millimetres. */
  longMm: mm.nullable().optional(),
  shortMm: mm.nullable().optional(),
  /** The container's own number, when it has one. */
  containerId: z.preprocess(blankToNull, z.string().trim().max(64, 'At most 64 characters').nullable()).optional(),
  handoffStatus: handoffStatusSchema.optional(),
};

const axesInOrder = (v: { longMm?: number | null; shortMm?: number | null }) => v.longMm == null || v.shortMm == null || v.shortMm <= v.longMm;
const axesMessage = { message: 'The short axis cannot be longer than the long axis', path: ['shortMm'] };

/** POST /api/cases/:caseId/specimens — `id` optional (made on the tablet to match its events); a repeat with the same id answers the stored one. */
export const createSpecimenSchema = z.strictObject({ id: uuidSchema.optional(), ...fields }).refine(axesInOrder, axesMessage);
export type CreateSpecimenInput = z.input<typeof createSpecimenSchema>;

/** PATCH /api/cases/:caseId/specimens/:specimenId — any of the fields. */
export const updateSpecimenSchema = z
  .strictObject({ ...fields, label: fields.label.optional() })
  .refine(axesInOrder, axesMessage)
  .refine((v) => Object.keys(v).length > 0, 'Nothing to change');
export type UpdateSpecimenInput = z.input<typeof updateSpecimenSchema>;

export const specimenSchema = z.object({
  id: uuidSchema,
  caseId: uuidSchema,
  label: z.string(),
  retrievalMethod: retrievalMethodSchema.nullable(),
  pieces: z.number().int().nullable(),
  longMm: z.number().nullable(),
  shortMm: z.number().nullable(),
  /** π/4 · long · short, mm² (shared/domain/geometry.ts); a computed note, not a measurement. */
  areaMm2: z.number().nullable(),
  containerId: z.string().nullable(),
  handoffStatus: handoffStatusSchema,
  createdAt: z.string(),
});
export type Specimen = z.infer<typeof specimenSchema>;
export const specimenListSchema = z.object({ specimens: z.array(specimenSchema) });

/** GET …/specimens/:specimenId/label.png|pdf query: the barcode's symbology. */
export const labelQuerySchema = z.strictObject({ symbology: z.enum(['datamatrix', 'code128']).default('datamatrix') });
