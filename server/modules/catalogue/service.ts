import type { Db } from '#server/db/client.ts';
import { catalogueItemTypes as storedTypes, type CatalogueItemRow } from '#server/db/schema/index.ts';
import type { Auditor } from '#server/http/audit.ts';
import { conflict, notFound } from '#server/http/errors.ts';
import type { Actor } from '#server/http/session.ts';
import { catalogueItemTypes, type CatalogueItem, type CatalogueItemType, type createCatalogueItemSchema } from '#shared/schemas/catalogue.ts';
import type { z } from 'zod';
import { isUniqueViolation } from '#server/db/errors.ts';
import { findItem, findItemByGtin, findItemByHibcc, insertItem, listItems, updateItem, type CatalogueValues } from './queries.ts';

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

/**
 * A GTIN, or an HIBCC labeler and product code, names one trade item: two catalogue entries with it could
 * not be told apart at a scan. Checked first for a clear answer; the unique indexes decide a race (two
 * submits at once), and their violation gets the same answer.
 */
async function assertCodesFree(db: Db, unitId: string, v: CatalogueValues, exceptId?: string): Promise<void> {
  if (v.gtin) {
    const other = await findItemByGtin(db, unitId, v.gtin);
    if (other && other.id !== exceptId) throw gtinTaken(v.gtin, other.description);
  }
  if (v.hibccLabeler && v.hibccProduct) {
    const other = await findItemByHibcc(db, unitId, v.hibccLabeler, v.hibccProduct);
    if (other && other.id !== exceptId) throw hibccTaken(v.hibccLabeler, v.hibccProduct, other.description);
  }
}

const gtinTaken = (gtin: string, description?: string) =>
  conflict(`GTIN ${gtin} is already in the catalogue${description ? ` as "${description}"` : ''}`, [{ path: 'gtin', message: 'Already in the catalogue' }]);
const hibccTaken = (labeler: string, product: string, description?: string) =>
  conflict(`HIBCC code ${labeler} ${product} is already in the catalogue${description ? ` as "${description}"` : ''}`, [{ path: 'hibccProduct', message: 'Already in the catalogue' }]);

/** The answer for a write that lost the race for a code to another. */
function codeRace(err: unknown, v: CatalogueValues): never {
  if (v.gtin && isUniqueViolation(err, 'catalogue_items_unit_gtin_key')) throw gtinTaken(v.gtin);
  if (v.hibccLabeler && v.hibccProduct && isUniqueViolation(err, 'catalogue_items_unit_hibcc_key')) throw hibccTaken(v.hibccLabeler, v.hibccProduct);
  throw err;
}

export async function createItem(db: Db, actor: Actor, input: ItemInput, audit: Auditor): Promise<CatalogueItem> {
  const { unitId } = actor;
  const v = values(input);
  await assertCodesFree(db, unitId, v);
  return db.transaction(async (tx) => {
    const row = await insertItem(tx, unitId, v);
    await audit(tx, { action: 'catalogue.create', entityType: 'catalogue_item', entityId: row.id, detail: { ...v } });
    return toCatalogueItem(row);
  }).catch((err: unknown) => codeRace(err, v));
}

export async function replaceItem(db: Db, actor: Actor, itemId: string, input: ItemInput, audit: Auditor): Promise<CatalogueItem> {
  const { unitId } = actor;
  const before = await findItem(db, unitId, itemId);
  if (!before) throw notFound('No such catalogue item in your unit');
  const v = values(input);
  await assertCodesFree(db, unitId, v, itemId);
  return db.transaction(async (tx) => {
    const row = (await updateItem(tx, unitId, itemId, v))!;
    await audit(tx, { action: 'catalogue.update', entityType: 'catalogue_item', entityId: itemId, detail: { before: snapshot(before), after: v } });
    return toCatalogueItem(row);
  }).catch((err: unknown) => codeRace(err, v));
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
