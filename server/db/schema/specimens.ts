import { index, integer, pgTable, real, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { cases } from './cases.ts';

/** A specimen of a case, from retrieval to hand-off to the laboratory. */
export const specimens = pgTable('specimens', {
  id: uuid('id').primaryKey().defaultRandom(),
  caseId: uuid('case_id').notNull().references(() => cases.id),
  label: text('label').notNull(),
  retrievalMethod: text('retrieval_method'),
  pieces: integer('pieces'),
  longMm: real('long_mm'),
  shortMm: real('short_mm'),
  containerId: text('container_id'),
  /** Where the specimen is on its way to the laboratory; the words are the specimens module's. */
  handoffStatus: text('handoff_status').notNull().default('pending'),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
}, (t) => [index('specimens_case_idx').on(t.caseId)]);

export type SpecimenRow = typeof specimens.$inferSelect;
