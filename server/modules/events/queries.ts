import { and, asc, eq, gt, inArray, sql } from 'drizzle-orm';
import type { Tx } from '#server/db/client.ts';
import { cases, events, member, type EventRow } from '#server/db/schema/index.ts';

export type { EventRow };

/** The case's unit and state, without a lock (for access checks and reads). */
export async function findCase(db: Tx, caseId: string) {
  const [row] = await db.select({ id: cases.id, unitId: cases.unitId, status: cases.status, lastSeq: cases.lastSeq })
    .from(cases).where(eq(cases.id, caseId)).limit(1);
  return row ?? null;
}

/** The user's role in the unit, or null for a user who is not a member there. */
export async function roleInUnit(db: Tx, userId: string, unitId: string): Promise<string | null> {
  const [row] = await db.select({ role: member.role }).from(member)
    .where(and(eq(member.userId, userId), eq(member.organizationId, unitId))).limit(1);
  return row?.role ?? null;
}

/** Which of these user ids are members of the unit with one of these roles. */
export async function membersWithRoles(db: Tx, unitId: string, userIds: string[], roles: readonly string[]): Promise<Set<string>> {
  const uuids = userIds.filter((id) => /^[0-9a-f-]{36}$/i.test(id));
  if (!uuids.length) return new Set();
  const rows = await db.select({ userId: member.userId }).from(member)
    .where(and(eq(member.organizationId, unitId), inArray(member.userId, uuids), inArray(member.role, [...roles])));
  return new Set(rows.map((r) => r.userId));
}

/** Lock the case row for the rest of the transaction: pushes to one case are serialized here. */
export async function lockCase(tx: Tx, caseId: string) {
  const [row] = await tx.select({ status: cases.status, lastSeq: cases.lastSeq }).from(cases)
    .where(eq(cases.id, caseId)).for('update');
  return row ?? null;
}

export async function findEventsByIds(tx: Tx, ids: string[]): Promise<EventRow[]> {
  if (!ids.length) return [];
  return tx.select().from(events).where(inArray(events.id, ids));
}

/** Which of these ids are events of this case (the targets a void or amend may name). */
export async function eventIdsInCase(tx: Tx, caseId: string, ids: string[]): Promise<Set<string>> {
  if (!ids.length) return new Set();
  const rows = await tx.select({ id: events.id }).from(events).where(and(eq(events.caseId, caseId), inArray(events.id, ids)));
  return new Set(rows.map((r) => r.id));
}

/**
 * Take `n` sequence numbers for the case (under the lock taken by lockCase) and set its status;
 * returns the new last sequence: the numbers given are lastSeq − n + 1 … lastSeq.
 */
export async function advanceCase(tx: Tx, caseId: string, n: number, status: string, closing: boolean): Promise<number> {
  const [row] = await tx.update(cases)
    .set({ lastSeq: sql`${cases.lastSeq} + ${n}`, status, ...(closing ? { closedAt: sql`now()` } : {}) })
    .where(eq(cases.id, caseId))
    .returning({ lastSeq: cases.lastSeq });
  if (!row) throw new Error(`case ${caseId} vanished inside its own lock`);
  return row.lastSeq;
}

export type NewEventRow = typeof events.$inferInsert;

/** INSERT … ON CONFLICT (id) DO NOTHING: the rows actually inserted come back. */
export async function insertEvents(tx: Tx, rows: NewEventRow[]): Promise<EventRow[]> {
  if (!rows.length) return [];
  return tx.insert(events).values(rows).onConflictDoNothing({ target: events.id }).returning();
}

/** Events of a case after a sequence, in order; one more than `limit` to tell whether more follow. */
export async function eventsAfter(db: Tx, caseId: string, afterSeq: number, limit: number): Promise<EventRow[]> {
  return db.select().from(events).where(and(eq(events.caseId, caseId), gt(events.seq, afterSeq)))
    .orderBy(asc(events.seq)).limit(limit + 1);
}
