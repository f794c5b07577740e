import type { Db } from '#server/db/client.ts';
import type { CatalogueItemRow, DeviceUsageRow } from '#server/db/schema/index.ts';
import type { Auditor } from '#server/http/audit.ts';
import { badRequest, conflict, HttpError, notFound } from '#server/http/errors.ts';
import type { Actor } from '#server/http/session.ts';
import { isExpired, parseIdentifier, type DeviceIdentifier } from '#shared/domain/identifiers/index.ts';
import { identifierSchemeSchema, type createDeviceUsageSchema, type DeviceUsage, type UsageWarning } from '#shared/schemas/device-usages.ts';
import type { z } from 'zod';
import { findItem, findItemByGtin, findItemByHibcc } from '../catalogue/queries.ts';
import { isUniqueViolation } from '#server/db/errors.ts';
import { assertOpen, caseOfUnit } from '../cases/access.ts';
import { findCaseEvent, findUsage, insertUsage, listUsages } from './queries.ts';

type CreateInput = z.output<typeof createDeviceUsageSchema>;

/** Event kinds a device can belong to (PRODUCT.md, Event vocabulary: devices). */
export const DEVICE_EVENT_KINDS = new Set(['clip_fired', 'loop_placed', 'device_applied', 'device_opened', 'device_wasted']);

/** The calendar day in a time zone, YYYY-MM-DD (en-CA formats dates as ISO). */
export const dayIn = (at: Date, timeZone: string) => new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(at);

export function warningsOf(r: Pick<DeviceUsageRow, 'expiry' | 'itemId' | 'createdAt'>, item: Pick<CatalogueItemRow, 'active'> | null, timeZone: string): UsageWarning[] {
  const out: UsageWarning[] = [];
  if (isExpired(r.expiry, dayIn(r.createdAt, timeZone))) out.push('expired');
  if (!r.itemId) out.push('not_in_catalogue');
  else if (item && !item.active) out.push('inactive_item');
  return out;
}

export function toDeviceUsage(r: DeviceUsageRow, warnings: UsageWarning[]): DeviceUsage {
  return {
    id: r.id, caseId: r.caseId, eventId: r.eventId, itemId: r.itemId, scheme: identifierSchemeSchema.parse(r.scheme),
    gtin: r.gtin, lot: r.lot, serial: r.serial, expiry: r.expiry, productionDate: r.productionDate,
    rawScan: r.rawScan, createdAt: r.createdAt.toISOString(), warnings,
  };
}

/** The catalogue item a reading names: by GTIN for GS1, by labeler and product for HIBCC. */
async function itemNamedBy(db: Db, unitId: string, id: DeviceIdentifier) {
  if (id.gtin) return findItemByGtin(db, unitId, id.gtin);
  if (id.labeler && id.product) return findItemByHibcc(db, unitId, id.labeler, id.product);
  return null;
}

export async function usagesOfCase(db: Db, actor: Actor, caseId: string): Promise<DeviceUsage[]> {
  await caseOfUnit(db, actor, caseId);
  const rows = await listUsages(db, caseId);
  const items = new Map<string, CatalogueItemRow | null>();
  for (const r of rows) if (r.itemId && !items.has(r.itemId)) items.set(r.itemId, await findItem(db, actor.unitId, r.itemId));
  return rows.map((r) => toDeviceUsage(r, warningsOf(r, r.itemId ? items.get(r.itemId) ?? null : null, actor.timeZone)));
}

/**
 * Store one device usage. The scanned text is read here with the shared parser: the server stores what
 * it reads, never what a client says it read. A repeat of the same id answers the stored usage.
 */
export async function recordUsage(db: Db, actor: Actor, caseId: string, input: CreateInput, audit: Auditor): Promise<{ usage: DeviceUsage; created: boolean }> {
  const c = await caseOfUnit(db, actor, caseId);
  // A repeat is answered before the status is looked at: a tablet whose first answer was lost may send
  // again after the sign-out closed the record, and must hear that the scan is stored.
  const repeat = async (id: string) => {
    const existing = await findUsage(db, id);
    if (existing && existing.caseId !== caseId) throw conflict('This usage id belongs to another case', [{ path: 'id', message: 'Already used' }]);
    if (!existing) return null;
    const item = existing.itemId ? await findItem(db, actor.unitId, existing.itemId) : null;
    return { usage: toDeviceUsage(existing, warningsOf(existing, item, actor.timeZone)), created: false };
  };
  const earlier = input.id ? await repeat(input.id) : null;
  if (earlier) return earlier;
  assertOpen(c);
  if (input.eventId) {
    const event = await findCaseEvent(db, caseId, input.eventId);
    // The tap may still be on its way from the tablet's outbox: 409 tells the tablet to try again shortly.
    if (!event) throw new HttpError(409, 'That event has not reached the server yet; the scan is sent again once it has', [{ path: 'eventId', message: 'Not yet stored' }]);
    if (!DEVICE_EVENT_KINDS.has(event.kind)) throw badRequest(`Invalid request body: eventId: a device cannot belong to a ${event.kind} event`, [{ path: 'eventId', message: `A ${event.kind} event has no device` }]);
  }
  const chosen = input.itemId ? await findItem(db, actor.unitId, input.itemId) : null;
  if (input.itemId && !chosen) throw notFound('No such catalogue item in your unit');

  const now = new Date();
  let row: Omit<DeviceUsageRow, 'id' | 'createdAt'>;
  if (input.rawScan) {
    const read = parseIdentifier(input.rawScan, { referenceDate: now });
    if (!read.ok) throw badRequest(`Invalid request body: rawScan: ${read.error}`, [{ path: 'rawScan', message: read.error }]);
    const id = read.value;
    const named = await itemNamedBy(db, actor.unitId, id);
    if (chosen && named && chosen.id !== named.id) {
      throw badRequest(`Invalid request body: itemId: the scanned code names "${named.description}", not "${chosen.description}"`, [{ path: 'itemId', message: `The code names "${named.description}"` }]);
    }
    // A code that names no catalogue item may still name another product than the one chosen.
    const otherProduct = chosen && !named && (
      (id.gtin && chosen.gtin && id.gtin !== chosen.gtin)
      || (id.labeler && id.product && chosen.hibccLabeler && (id.labeler !== chosen.hibccLabeler || id.product !== chosen.hibccProduct)));
    if (otherProduct) {
      throw badRequest(`Invalid request body: itemId: the scanned code is not that of "${chosen.description}"`, [{ path: 'itemId', message: `The code is not that of "${chosen.description}"` }]);
    }
    row = {
      caseId, eventId: input.eventId ?? null, itemId: (named ?? chosen)?.id ?? null, scheme: id.scheme, gtin: id.gtin,
      lot: id.lot, serial: id.serial, expiry: id.expiry, productionDate: id.productionDate, rawScan: input.rawScan,
    };
  } else {
    const m = input.manual ?? {};
    row = {
      caseId, eventId: input.eventId ?? null, itemId: chosen!.id, scheme: 'manual', gtin: chosen!.gtin,
      lot: m.lot ?? null, serial: m.serial ?? null, expiry: m.expiry ?? null, productionDate: null, rawScan: null,
    };
  }
  return db.transaction(async (tx) => {
    const stored = await insertUsage(tx, { ...row, ...(input.id ? { id: input.id } : {}) });
    const item = stored.itemId ? (stored.itemId === chosen?.id ? chosen : await findItem(tx, actor.unitId, stored.itemId)) : null;
    const warnings = warningsOf(stored, item, actor.timeZone);
    await audit(tx, { action: 'device_usage.create', entityType: 'device_usage', entityId: stored.id, detail: { caseId, eventId: stored.eventId, itemId: stored.itemId, lot: stored.lot, warnings } });
    return { usage: toDeviceUsage(stored, warnings), created: true };
  }).catch(async (err: unknown) => {
    // The same id sent twice at once (two tabs flushing one outbox): the one stored answers both.
    const raced = input.id && isUniqueViolation(err, 'device_usages_pkey') ? await repeat(input.id) : null;
    if (raced) return raced;
    throw err;
  });
}
