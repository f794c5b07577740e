import { and, asc, between, eq, gt, inArray, sql } from 'drizzle-orm';
import type { Tx } from '#server/db/client.ts';
import { cases, events, member, type EventRow } from '#server/db/schema/index.ts';

export type { EventRow };

/** The case's unit and state, without a lock (for access checks and reads). */
export async function findCase(db: Tx, caseId: string) {
  const [row] = await db.select({ id: cases.id, unitId: cases.unitId, status: cases.status, lastSeq: cases.lastSeq })
    .from(cases).where(eq(cases.id, caseId)).limit(1);
  return row ?? null;
}

/**
 * The case's unit and state with the user's role in that unit (null for a user who is not a member
 * there), in one statement: the access check of every push and join.
 */
export async function findCaseWithRole(db: Tx, caseId: string, userId: string) {
  const [row] = await db.select({ id: cases.id, unitId: cases.unitId, status: cases.status, lastSeq: cases.lastSeq, role: member.role })
    .from(cases)
    .leftJoin(member, and(eq(member.organizationId, cases.unitId), eq(member.userId, userId)))
    .where(eq(cases.id, caseId)).limit(1);
  return row ?? null;
}

/** Which of these user ids are members of the case's unit with one of these roles. */
export async function caseMembersWithRoles(db: Tx, caseId: string, userIds: string[], roles: readonly string[]): Promise<Set<string>> {
  const uuids = userIds.filter((id) => /^[0-9a-f-]{36}$/i.test(id));
  if (!uuids.length) return new Set();
  const rows = await db.select({ userId: member.userId }).from(member)
    .innerJoin(cases, eq(cases.unitId, member.organizationId))
    .where(and(eq(cases.id, caseId), inArray(member.userId, uuids), inArray(member.role, [...roles])));
  return new Set(rows.map((r) => r.userId));
}

/** Lock the case row for the rest of the transaction: pushes to one case are serialized here. */
export async function lockCase(tx: Tx, caseId: string) {
  const [row] = await tx.select({ status: cases.status, lastSeq: cases.lastSeq }).from(cases)
    .where(eq(cases.id, caseId)).for('update');
  return row ?? null;
}

/**
 * The stored events with these ids, in any case: the ids of a push (a repeat, or an id already used)
 * and the targets its voids and amends name (which must be of the push's case), read at once.
 */
export async function findEventsByIds(tx: Tx, ids: string[]): Promise<EventRow[]> {
  if (!ids.length) return [];
  // One array parameter, not one per id: a push names up to 500 ids (and as many targets).
  return tx.select().from(events).where(sql`${events.id} = any(${sql.param(ids)}::uuid[])`);
}

/** An accepted event as it is inserted (device time as ISO text, sequence given under the lock). */
export type NewEventRow = {
  id: string; caseId: string; seq: number; kind: string; deviceTime: string; offsetMs: number;
  offsetUncertaintyMs: number | null; author: string; device: string; payload: unknown;
};

/**
 * Store accepted events and advance the case in one statement, under the lock taken by lockCase (so
 * the rows' sequences, lastSeq + 1 … lastSeq + n, are known before): the UPDATE of the case is a
 * data-modifying CTE of the INSERT … ON CONFLICT (id) DO NOTHING. The rows travel as one JSON
 * parameter (jsonb_to_recordset), which PostgreSQL parses faster than a 500-row VALUES list is built;
 * what comes back is the id, seq and receivedAt of each row actually inserted.
 */
export async function insertEventsAndAdvance(tx: Tx, caseId: string, rows: NewEventRow[], status: string, closing: boolean) {
  if (!rows.length) return [];
  const json = JSON.stringify(rows.map((r) => ({
    id: r.id, case_id: r.caseId, seq: r.seq, kind: r.kind, device_time: r.deviceTime, offset_ms: r.offsetMs,
    offset_uncertainty_ms: r.offsetUncertaintyMs, author: r.author, device: r.device, payload: r.payload,
  })));
  const result = await tx.execute<{ id: string; seq: number; received_at: Date | string }>(sql`
    with advanced as (
      update ${cases} set last_seq = last_seq + ${rows.length}, status = ${status}${closing ? sql`, closed_at = now()` : sql``}
      where id = ${caseId}
    )
    insert into ${events} (id, case_id, seq, kind, device_time, offset_ms, offset_uncertainty_ms, author, device, payload)
    select r.id, r.case_id, r.seq, r.kind, r.device_time, r.offset_ms, r.offset_uncertainty_ms, r.author, r.device, r.payload
    from jsonb_to_recordset(${json}::jsonb) as r(id uuid, case_id uuid, seq integer, kind text, device_time timestamptz,
      offset_ms double precision, offset_uncertainty_ms double precision, author text, device text, payload jsonb)
    on conflict (id) do nothing
    returning id, seq, received_at`);
  return result.rows.map((r) => ({ id: r.id, seq: r.seq, receivedAt: new Date(r.received_at) }));
}

/** Events of a case from one sequence to another (both included), in order: one push's stored events. */
export async function eventsBetween(db: Tx, caseId: string, fromSeq: number, toSeq: number): Promise<EventRow[]> {
  return db.select().from(events).where(and(eq(events.caseId, caseId), between(events.seq, fromSeq, toSeq)))
    .orderBy(asc(events.seq));
}

/** Events of a case after a sequence, in order; one more than `limit` to tell whether more follow. */
export async function eventsAfter(db: Tx, caseId: string, afterSeq: number, limit: number): Promise<EventRow[]> {
  return db.select().from(events).where(and(eq(events.caseId, caseId), gt(events.seq, afterSeq)))
    .orderBy(asc(events.seq)).limit(limit + 1);
}
