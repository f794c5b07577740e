import { check, jsonb, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { user } from './auth.ts';
import { cases } from './cases.ts';
import { oneOf } from './sql.ts';

export const reportStatuses = ['draft', 'signed'] as const;

/** An addendum written after signing; the signed body never changes. */
export type Addendum = { id: string; authorId: string; text: string; at: string };

/** The procedure report of a case (one per case): a draft, then signed and locked, then addenda. */
export const reports = pgTable('reports', {
  id: uuid('id').primaryKey().defaultRandom(),
  caseId: uuid('case_id').notNull().references(() => cases.id),
  status: text('status').notNull().default('draft'),
  body: jsonb('body').$type<Record<string, unknown>>().notNull().default({}),
  signedBy: uuid('signed_by').references(() => user.id),
  signedAt: timestamp('signed_at', { withTimezone: true }),
  addenda: jsonb('addenda').$type<Addendum[]>().notNull().default([]),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
}, (t) => [
  uniqueIndex('reports_case_key').on(t.caseId),
  check('reports_status_check', oneOf(t.status, reportStatuses)),
]);

export type ReportRow = typeof reports.$inferSelect;
