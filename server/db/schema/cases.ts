import { check, index, integer, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { caseStatuses, parisTypes, procedureTypes, sedationTypes } from '#shared/schemas/cases.ts';
import { organization, user } from './auth.ts';
import { patients } from './patients.ts';
import { rooms } from './rooms.ts';
import { oneOf } from './sql.ts';

/** One procedure: scheduled, recorded, closed, reported (or cancelled before it began). */
export const cases = pgTable('cases', {
  id: uuid('id').primaryKey().defaultRandom(),
  unitId: uuid('unit_id').notNull().references(() => organization.id),
  patientId: uuid('patient_id').notNull().references(() => patients.id),
  roomId: uuid('room_id').notNull().references(() => rooms.id),
  procedureType: text('procedure_type').notNull(),
  indication: text('indication').notNull(),
  lesionSite: text('lesion_site').notNull(),
  lesionSizeMm: integer('lesion_size_mm').notNull(),
  lesionParis: text('lesion_paris').notNull(),
  sedation: text('sedation').notNull(),
  endoscopistId: uuid('endoscopist_id').notNull().references(() => user.id),
  nurseId: uuid('nurse_id').notNull().references(() => user.id),
  scheduledAt: timestamp('scheduled_at', { withTimezone: true }).notNull(),
  status: text('status').notNull().default('scheduled'),
  createdBy: uuid('created_by').references(() => user.id),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  closedAt: timestamp('closed_at', { withTimezone: true }),
  cancelledAt: timestamp('cancelled_at', { withTimezone: true }),
  cancelReason: text('cancel_reason'),
  /** The highest event sequence number given in this case (0 before the first event). */
  lastSeq: integer('last_seq').notNull().default(0),
}, (t) => [
  index('cases_unit_scheduled_idx').on(t.unitId, t.scheduledAt),
  index('cases_room_scheduled_idx').on(t.roomId, t.scheduledAt),
  check('cases_status_check', oneOf(t.status, caseStatuses)),
  check('cases_procedure_type_check', oneOf(t.procedureType, procedureTypes)),
  check('cases_sedation_check', oneOf(t.sedation, sedationTypes)),
  check('cases_lesion_paris_check', oneOf(t.lesionParis, parisTypes)),
]);

export type CaseRow = typeof cases.$inferSelect;
