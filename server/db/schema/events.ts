import { doublePrecision, integer, jsonb, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { cases } from './cases.ts';

/**
 * The append-only event log of a case. The id is made on the tablet (UUIDv7) and is the idempotency key;
 * `seq` is given by the server, 1, 2, … per case. A trigger (drizzle/*_events_append_only.sql) refuses
 * UPDATE, DELETE and TRUNCATE: corrections are new `void` and `amend` events.
 */
export const events = pgTable('events', {
  id: uuid('id').primaryKey(),
  caseId: uuid('case_id').notNull().references(() => cases.id),
  seq: integer('seq').notNull(),
  kind: text('kind').notNull(),
  deviceTime: timestamp('device_time', { withTimezone: true }).notNull(),
  offsetMs: doublePrecision('offset_ms').notNull(),
  offsetUncertaintyMs: doublePrecision('offset_uncertainty_ms'),
  author: text('author').notNull(),
  device: text('device').notNull(),
  payload: jsonb('payload').$type<Record<string, unknown>>().notNull(),
  receivedAt: timestamp('received_at', { withTimezone: true }).notNull().defaultNow(),
}, (t) => [
  // Also the index for "events of a case after seq n" (the catch-up read).
  uniqueIndex('events_case_seq_key').on(t.caseId, t.seq),
]);

export type EventRow = typeof events.$inferSelect;
