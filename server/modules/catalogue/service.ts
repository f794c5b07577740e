import type { Db } from '#server/db/client.ts';
import { catalogueItemTypes as storedTypes, type CatalogueItemRow } from '#server/db/schema/index.ts';
import type { Auditor } from '#server/http/audit.ts';
import { conflict, notFound } from '#server/http/errors.ts';
import type { Actor } from '#server/http/session.ts';
import { catalogueItemTypes, type CatalogueItem, type CatalogueItemType, type createCatalogueItemSchema } from '#shared/schemas/catalogue.ts';
import type { z } from 'zod';
import { findItem, findItemByGtin, insertItem, listItems, updateItem, type CatalogueValues } from './queries.ts';

// The table's CHECK list and the API's list must be the same words, in both directions.
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : never) : never;
const sameTypes: Same<(typeof storedTypes)[number], (typeof catalogueItemTypes)[number]> = true;
void sameTypes;

type ItemInput = z.output<typeof createCatalogueItemSchema>;

export function toCatalogueItem(r: CatalogueItemRow): CatalogueItem {
  return {
    id: r.id, description: r.description, type: r.type as CatalogueItemType, sizeLabel: r.sizeLabel,
    gtin: r.gtin, hibccLabeler: r.hibccLabeler, hibccProduct: r.hibccProduct, active: r.active,
    createdAt: r.createdAt.toISOString(),
  };
}

const values = (v: ItemInput): CatalogueValues => ({
  description: v.description, type: v.type, sizeLabel: v.sizeLabel ?? null,
  gtin: v.gtin ?? null, hibccLabeler: v.hibccLabeler ?? null, hibccProduct: v.hibccProduct ?? null,
});

const snapshot = (r: CatalogueItemRow): CatalogueValues => ({
  description: r.description, type: r.type, sizeLabel: r.sizeLabel, gtin: r.gtin, hibccLabeler: r.hibccLabeler, hibccProduct: r.hibccProduct,
});

export async function catalogueList(db: Db, unitId: string, includeInactive: boolean): Promise<CatalogueItem[]> {
  return (await listItems(db, unitId, includeInactive)).map(toCatalogueItem);
}

/** A GTIN names one trade item: two catalogue entries with it could not be told apart at a scan. */
async function assertGtinFree(db: Db, unitId: string, gtin: string | null, exceptId?: string): Promise<void> {
  if (!gtin) return;
  const other = await findItemByGtin(db, unitId, gtin);
  if (other && other.id !== exceptId) {
    throw conflict(`GTIN ${gtin} is already in the catalogue as "${other.description}"`, [{ path: 'gtin', message: 'Already in the catalogue' }]);
  }
}

export async function createItem(db: Db, actor: Actor, input: ItemInput, audit: Auditor): Promise<CatalogueItem> {
  const { unitId } = actor;
  await assertGtinFree(db, unitId, input.gtin ?? null);
  return db.transaction(async (tx) => {
    const row = await insertItem(tx, unitId, values(input));
    await audit(tx, { action: 'catalogue.create', entityType: 'catalogue_item', entityId: row.id, detail: { ...values(input) } });
    return toCatalogueItem(row);
  });
}

export async function replaceItem(db: Db, actor: Actor, itemId: string, input: ItemInput, audit: Auditor): Promise<CatalogueItem> {
  const { unitId } = actor;
  const before = await findItem(db, unitId, itemId);
  if (!before) throw notFound('No such catalogue item in your unit');
  await assertGtinFree(db, unitId, input.gtin ?? null, itemId);
  return db.transaction(async (tx) => {
    const row = (await updateItem(tx, unitId, itemId, values(input)))!;
    await audit(tx, { action: 'catalogue.update', entityType: 'catalogue_item', entityId: itemId, detail: { before: snapshot(before), after: values(input) } });
    return toCatalogueItem(row);
  });
}

export async function setItemActive(db: Db, actor: Actor, itemId: string, active: boolean, audit: Auditor): Promise<CatalogueItem> {
  const { unitId } = actor;
  return db.transaction(async (tx) => {
    const row = await updateItem(tx, unitId, itemId, { active });
    if (!row) throw notFound('No such catalogue item in your unit');
    await audit(tx, { action: active ? 'catalogue.reactivate' : 'catalogue.deactivate', entityType: 'catalogue_item', entityId: itemId });
    return toCatalogueItem(row);
  });
}
