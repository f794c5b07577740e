import { bigserial, index, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';

/**
 * Who did or saw what, when, from where. No foreign keys: an entry outlives the user, case or unit it
 * names. Every view of a patient's record writes here (PRODUCT.md, Roles).
 */
export const auditLog = pgTable('audit_log', {
  id: bigserial('id', { mode: 'number' }).primaryKey(),
  at: timestamp('at', { withTimezone: true }).notNull().defaultNow(),
  userId: uuid('user_id'),
  unitId: uuid('unit_id'),
  /** Dotted verb, e.g. `case.view`, `case.schedule`, `invitation.create`. */
  action: text('action').notNull(),
  entityType: text('entity_type').notNull(),
  entityId: text('entity_id'),
  detail: jsonb('detail').$type<Record<string, unknown>>(),
  ip: text('ip'),
}, (t) => [
  index('audit_log_unit_at_idx').on(t.unitId, t.at),
  index('audit_log_entity_idx').on(t.entityType, t.entityId),
]);

export type AuditRow = typeof auditLog.$inferSelect;
