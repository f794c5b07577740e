import { char, check, date, index, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { cases } from './cases.ts';
import { catalogueItems } from './catalogue.ts';
import { events } from './events.ts';
import { oneOf } from './sql.ts';

export const identifierSchemes = ['gs1', 'hibcc', 'manual'] as const;

/** One device used in a case, with what its label said (lot, serial, dates) and how it was read. */
export const deviceUsages = pgTable('device_usages', {
  id: uuid('id').primaryKey().defaultRandom(),
  caseId: uuid('case_id').notNull().references(() => cases.id),
  /** The event that recorded the use (clip_fired, loop_placed, …), when there is one. */
  eventId: uuid('event_id').references(() => events.id),
  itemId: uuid('item_id').references(() => catalogueItems.id),
  scheme: text('scheme').notNull(),
  gtin: char('gtin', { length: 14 }),
  lot: text('lot'),
  serial: text('serial'),
  expiry: date('expiry', { mode: 'string' }),
  productionDate: date('production_date', { mode: 'string' }),
  /** The scanned text as read, group separators kept, for audit. */
  rawScan: text('raw_scan'),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
}, (t) => [
  index('device_usages_case_idx').on(t.caseId),
  check('device_usages_scheme_check', oneOf(t.scheme, identifierSchemes)),
]);

export type DeviceUsageRow = typeof deviceUsages.$inferSelect;
