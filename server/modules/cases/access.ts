import type { Tx } from '#server/db/client.ts';
import { conflict, notFound } from '#server/http/errors.ts';
import type { Actor } from '#server/http/session.ts';
import { findCaseRecord } from './queries.ts';

/** Statuses in which specimens and device usages may still be written (PRODUCT.md: until the record is closed). */
const OPEN_STATUSES = new Set(['scheduled', 'recording']);

/** A case of the actor's unit; another unit's case is not found, the same as no case. */
export async function caseOfUnit(db: Tx, actor: Actor, caseId: string) {
  const row = await findCaseRecord(db, actor.unitId, caseId);
  if (!row) throw notFound('No such case in your unit');
  return row;
}

/** 409 once the record is closed: late corrections are amendments, never edits. */
export function assertOpen(row: { status: string }): void {
  if (!OPEN_STATUSES.has(row.status)) throw conflict(`The record of this case is ${row.status}; specimens and devices can no longer be changed here`);
}

/** As caseOfUnit, and 409 once the record is closed. */
export async function openCaseOfUnit(db: Tx, actor: Actor, caseId: string) {
  const row = await caseOfUnit(db, actor, caseId);
  assertOpen(row);
  return row;
}
