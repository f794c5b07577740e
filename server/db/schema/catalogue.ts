import { boolean, char, check, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { organization } from './auth.ts';
import { oneOf } from './sql.ts';

/** Kinds of device the catalogue holds (trade words). */
export const catalogueItemTypes = ['clip', 'loop', 'over_the_scope_clip', 'suturing_device', 'injection_needle', 'knife', 'snare', 'net', 'other'] as const;
export type CatalogueItemType = (typeof catalogueItemTypes)[number];

/** The unit's device catalogue: what can be scanned or chosen during a case. */
export const catalogueItems = pgTable('catalogue_items', {
  id: uuid('id').primaryKey().defaultRandom(),
  unitId: uuid('unit_id').notNull().references(() => organization.id),
  description: text('description').notNull(),
  type: text('type').notNull(),
  sizeLabel: text('size_label'),
  /** GS1 GTIN-14 (GTIN-8/12/13 left-padded with zeros), check digit included. */
  gtin: char('gtin', { length: 14 }),
  /** HIBCC labeler identification code (4 characters) and product/catalogue number. */
  hibccLabeler: text('hibcc_labeler'),
  hibccProduct: text('hibcc_product'),
  active: boolean('active').notNull().default(true),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
}, (t) => [
  uniqueIndex('catalogue_items_unit_gtin_key').on(t.unitId, t.gtin),
  // One item per HIBCC labeler and product code, as per GTIN (rows without a code repeat freely: NULLs are distinct).
  uniqueIndex('catalogue_items_unit_hibcc_key').on(t.unitId, t.hibccLabeler, t.hibccProduct),
  check('catalogue_items_type_check', oneOf(t.type, catalogueItemTypes)),
]);

export type CatalogueItemRow = typeof catalogueItems.$inferSelect;
