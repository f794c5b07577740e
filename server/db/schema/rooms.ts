import { boolean, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { organization } from './auth.ts';

/** A procedure room of a unit ("Room A"). */
export const rooms = pgTable('rooms', {
  id: uuid('id').primaryKey().defaultRandom(),
  unitId: uuid('unit_id').notNull().references(() => organization.id),
  name: text('name').notNull(),
  active: boolean('active').notNull().default(true),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
}, (t) => [uniqueIndex('rooms_unit_name_key').on(t.unitId, t.name)]);

export type RoomRow = typeof rooms.$inferSelect;
