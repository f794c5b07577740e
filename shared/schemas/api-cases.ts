import { z } from 'zod';
import { isoDateTimeSchema, uuidSchema } from './common.ts';
import { caseSummarySchema } from './cases.ts';

/** `:id` of /api/cases/:id/… */
export const caseIdParamsSchema = z.object({ id: uuidSchema });

/** GET /api/cases/:id — one case, as the summary plus its lifecycle. Reading it is audited. */
export const caseDetailSchema = caseSummarySchema.extend({
  createdAt: isoDateTimeSchema,
  closedAt: isoDateTimeSchema.nullable(),
  cancelledAt: isoDateTimeSchema.nullable(),
  cancelReason: z.string().nullable(),
  /** The highest event sequence number stored (0 before the first event). */
  lastSeq: z.number().int().min(0),
});
export type CaseDetail = z.infer<typeof caseDetailSchema>;

/** POST /api/cases/:id/cancel — only a scheduled case; the reason is kept with it. */
export const cancelCaseSchema = z.object({
  reason: z.string().trim().min(1, 'Give a reason').max(500).optional(),
});
export type CancelCaseInput = z.infer<typeof cancelCaseSchema>;
