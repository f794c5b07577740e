import { doublePrecision, index, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { user } from './auth.ts';
import { cases } from './cases.ts';
import { events } from './events.ts';

/** A reviewer's note on a case, at an event or at a moment (ms from scope in), or on the whole case. */
export const reviewAnnotations = pgTable('review_annotations', {
  id: uuid('id').primaryKey().defaultRandom(),
  caseId: uuid('case_id').notNull().references(() => cases.id),
  authorId: uuid('author_id').notNull().references(() => user.id),
  eventId: uuid('event_id').references(() => events.id),
  atMs: doublePrecision('at_ms'),
  text: text('text').notNull(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
}, (t) => [index('review_annotations_case_idx').on(t.caseId)]);

export type ReviewAnnotationRow = typeof reviewAnnotations.$inferSelect;
