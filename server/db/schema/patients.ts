import { check, date, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { sexes } from '#shared/schemas/cases.ts';
import { organization } from './auth.ts';
import { oneOf } from './sql.ts';

/** A patient as the unit knows them; the hospital number is unique within the unit. */
export const patients = pgTable('patients', {
  id: uuid('id').primaryKey().defaultRandom(),
  unitId: uuid('unit_id').notNull().references(() => organization.id),
  hospitalNumber: text('hospital_number').notNull(),
  familyName: text('family_name').notNull(),
  givenName: text('given_name').notNull(),
  birthDate: date('birth_date', { mode: 'string' }).notNull(),
  sex: text('sex').notNull(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
}, (t) => [
  uniqueIndex('patients_unit_hospital_number_key').on(t.unitId, t.hospitalNumber),
  check('patients_sex_check', oneOf(t.sex, sexes)),
]);

export type PatientRow = typeof patients.$inferSelect;
