import { and, asc, desc, eq } from 'drizzle-orm';
import type { Tx } from '#server/db/client.ts';
import { catalogueItems, type CatalogueItemRow } from '#server/db/schema/index.ts';

export type CatalogueValues = Pick<CatalogueItemRow, 'description' | 'type' | 'sizeLabel' | 'gtin' | 'hibccLabeler' | 'hibccProduct'>;

/** The unit's items, in-use ones first, then by type and description. */
export async function listItems(db: Tx, unitId: string, includeInactive: boolean) {
  return db.select().from(catalogueItems)
    .where(and(eq(catalogueItems.unitId, unitId), includeInactive ? undefined : eq(catalogueItems.active, true)))
    .orderBy(asc(catalogueItems.type), asc(catalogueItems.description));
}

/** One item of this unit, or null (another unit's item is not found). */
export async function findItem(db: Tx, unitId: string, itemId: string) {
  const [row] = await db.select().from(catalogueItems)
    .where(and(eq(catalogueItems.id, itemId), eq(catalogueItems.unitId, unitId))).limit(1);
  return row ?? null;
}

/** The unit's item with this GTIN (14 digits), active or not. */
export async function findItemByGtin(db: Tx, unitId: string, gtin: string) {
  const [row] = await db.select().from(catalogueItems)
    .where(and(eq(catalogueItems.unitId, unitId), eq(catalogueItems.gtin, gtin))).limit(1);
  return row ?? null;
}

/** The unit's item with this HIBCC labeler and product code, active ones first. */
export async function findItemByHibcc(db: Tx, unitId: string, labeler: string, product: string) {
  const [row] = await db.select().from(catalogueItems)
    .where(and(eq(catalogueItems.unitId, unitId), eq(catalogueItems.hibccLabeler, labeler), eq(catalogueItems.hibccProduct, product)))
    .orderBy(desc(catalogueItems.active)).limit(1);
  return row ?? null;
}

export async function insertItem(db: Tx, unitId: string, values: CatalogueValues) {
  const [row] = await db.insert(catalogueItems).values({ unitId, ...values }).returning();
  return row!;
}

export async function updateItem(db: Tx, unitId: string, itemId: string, values: Partial<CatalogueValues & { active: boolean }>) {
  const [row] = await db.update(catalogueItems).set(values)
    .where(and(eq(catalogueItems.id, itemId), eq(catalogueItems.unitId, unitId))).returning();
  return row ?? null;
}
