import { z } from 'zod';
import { isoDateTimeSchema, uuidSchema } from './common.ts';

/** GET /api/audit (admin, supervisor) — the unit's audit log, newest first, a page at a time. */
export const auditQuerySchema = z.object({
  /** Entries older than this id (the `nextBefore` of the previous page). */
  before: z.coerce.number().int().positive().optional(),
  limit: z.coerce.number().int().min(1).max(500).default(100),
  entityType: z.string().trim().min(1).max(40).optional(),
  entityId: z.string().trim().min(1).max(64).optional(),
  userId: uuidSchema.optional(),
  action: z.string().trim().min(1).max(60).optional(),
});
export type AuditQuery = z.infer<typeof auditQuerySchema>;

export const auditEntrySchema = z.object({
  id: z.number().int(),
  at: isoDateTimeSchema,
  user: z.object({ id: z.string(), name: z.string() }).nullable(),
  action: z.string(),
  entityType: z.string(),
  entityId: z.string().nullable(),
  detail: z.record(z.string(), z.unknown()).nullable(),
  ip: z.string().nullable(),
});
export type AuditEntry = z.infer<typeof auditEntrySchema>;

export const auditPageSchema = z.object({
  entries: z.array(auditEntrySchema),
  /** Pass as `before` for the next (older) page; null on the last page. */
  nextBefore: z.number().int().nullable(),
});
export type AuditPage = z.infer<typeof auditPageSchema>;
