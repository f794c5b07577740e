import { asc, eq, inArray, sql } from 'drizzle-orm';
import type { Tx } from '#server/db/client.ts';
import { catalogueItems, events, user } from '#server/db/schema/index.ts';
import type { RecordEventInput } from '#shared/domain/record/index.ts';
import { uuidSchema } from '#shared/schemas/common.ts';

/**
 * A case's stored log as the reducer reads it. The corrected time (device time + offset, RFC 5905 θ) is
 * taken in SQL from the timestamp itself, so no text form of the timestamp is parsed in JavaScript.
 */
export async function recordInputs(db: Tx, caseId: string): Promise<RecordEventInput[]> {
  const rows = await db.select({
    id: events.id, kind: events.kind, seq: events.seq, payload: events.payload, author: events.author, device: events.device,
    atMs: sql<string>`(extract(epoch from ${events.deviceTime}) * 1000 + ${events.offsetMs})::float8`,
  }).from(events).where(eq(events.caseId, caseId)).orderBy(asc(events.seq));
  return rows.map((r) => ({ ...r, atMs: Number(r.atMs) }));
}

/** Display names of users by id (ids that are not user ids are skipped). */
export async function namesOf(db: Tx, ids: Iterable<string>): Promise<Map<string, string>> {
  const wanted = [...new Set(ids)].filter((id) => uuidSchema.safeParse(id).success);
  if (wanted.length === 0) return new Map();
  const rows = await db.select({ id: user.id, name: user.name }).from(user).where(inArray(user.id, wanted));
  return new Map(rows.map((r) => [r.id, r.name]));
}

/** The unit's whole catalogue (small: a unit keeps tens of items), active or not, by id. */
export async function catalogueById(db: Tx, unitId: string) {
  const rows = await db.select().from(catalogueItems).where(eq(catalogueItems.unitId, unitId));
  return new Map(rows.map((r) => [r.id, r]));
}
