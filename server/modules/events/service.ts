import type { Db, Tx } from '#server/db/client.ts';
import { EVENTS_PAGE_SIZE, type EventsPage, type PushResult } from '#shared/contracts/sync.ts';
import { statusAfterEvent } from '#shared/domain/case-status.ts';
import { rolesFor } from '#shared/domain/permissions.ts';
import type { CaseStatus } from '#shared/schemas/cases.ts';
import type { EventKind, NewEvent, StoredEvent } from '#shared/schemas/events.ts';
import { checkItem, eventToRow, insertedToStored, rowToStored, sameContent, type Checked } from './intake.ts';
import { caseMembersWithRoles, eventsAfter, findCase, findEventsByIds, insertEventsAndAdvance, lockCase } from './queries.ts';

/**
 * Storing a push of events, idempotently, with a gap-free per-case sequence.
 *
 * One transaction per push. The case row is locked first (SELECT … FOR UPDATE), so pushes to one case
 * from any tablet through any server node take their turn; the events the push names (its ids and the
 * targets of its voids and amends) are read next, in one statement taken after the lock, so it sees
 * every push committed before. The accepted events get lastSeq + 1 … lastSeq + n (lastSeq as locked)
 * and are inserted with INSERT … ON CONFLICT (id) DO NOTHING in the same statement as the
 * `UPDATE cases SET last_seq = last_seq + n` (a data-modifying CTE). An id already stored is a repeat delivery
 * ('duplicate', with the sequence it got then) when its content is the same, and refused when it is not.
 * Should an id be taken concurrently by another case's push (only a forged id can), fewer rows come
 * back than sequences were taken: the transaction is rolled back and run again, so no gap is left.
 *
 * Each event is judged alone; a refused one never stops the others. The rules, in order:
 *   1. at most MAX_EVENT_BYTES of JSON, valid by the event schema, of the case it was sent to;
 *   2. its author is a nurse or endoscopist of the case's unit (a shared tablet may push events that
 *      a colleague tapped before signing out, so the author need not be the pushing user);
 *   3. the case's status: a scheduled or recording case takes every kind; once closed (by a sign_out)
 *      or reported, only `amend` is taken (late corrections are amendments, PRODUCT.md), not even a
 *      `void`; a cancelled case takes nothing;
 *   4. a `void` or `amend` names an event of this case (stored, or earlier in the same push).
 * Status moves: the first accepted event makes a scheduled case recording; an accepted sign_out closes it.
 *
 * Round trips to the database, each one a wait on a busy machine, run side by side where the
 * guarantees allow: the caller's checks (the session, the case access) and the read of the recorders
 * of rule 2 go out at once, before the transaction; inside it there are BEGIN, the lock, one read, one
 * write and the COMMIT. Nothing waits for a pooled connection while it holds one (a transaction that
 * did could wait for ever once every connection is held by such transactions).
 */

const RECORDER_ROLES = rolesFor('event.record');

class LostRace extends Error {}

export type RecordOutcome = { results: PushResult[]; stored: StoredEvent[] };

/**
 * What a push waits on before its transaction begins. `access` resolves once the pusher may record in
 * the case and rejects (with the refusal to answer) otherwise; `confirmed`, when given (the socket's
 * session check), must resolve too, and its refusal comes first.
 */
export type PushGate = { caseId: string; access: Promise<unknown>; confirmed?: Promise<unknown> };

export async function recordEvents(db: Db, gate: PushGate, items: readonly unknown[]): Promise<RecordOutcome> {
  const { caseId } = gate;
  const checked = items.map((item) => checkItem(item, caseId));
  const authors = [...new Set(checked.flatMap((c) => (c.ok ? [c.event.author] : [])))];
  // Read beside the checks (by the case's own unit), not under the lock: membership is not what the lock orders.
  const recordersRead = caseMembersWithRoles(db, caseId, authors, RECORDER_ROLES);
  const confirmed = gate.confirmed ?? Promise.resolve();
  const [, , recorders] = await Promise.all([
    confirmed,
    gate.access.catch(async (err: unknown) => { await confirmed; throw err; }),
    recordersRead,
  ]);
  for (let attempt = 1; ; attempt++) {
    try {
      return await db.transaction((tx) => storeBatch(tx, caseId, checked, recorders));
    } catch (err) {
      if (!(err instanceof LostRace) || attempt >= 3) throw err;
    }
  }
}

function statusRefusal(status: CaseStatus, kind: EventKind): string | null {
  if (status === 'cancelled') return 'This case was cancelled; nothing can be recorded in it';
  if ((status === 'closed' || status === 'reported') && kind !== 'amend') return `The record of this case is ${status}; only amendments are accepted now`;
  return null;
}

const targetOf = (e: NewEvent) => (e.kind === 'void' || e.kind === 'amend' ? e.payload.targetId : null);

async function storeBatch(tx: Tx, caseId: string, checked: Checked[], recorders: Set<string>): Promise<RecordOutcome> {
  const locked = await lockCase(tx, caseId);
  if (!locked) throw new Error(`case ${caseId} not found after its access check`);
  const valid = checked.flatMap((c) => (c.ok ? [c.event] : []));
  const named = [...new Set([...valid.map((e) => e.id), ...valid.flatMap((e) => targetOf(e) ?? [])])];
  const namedRows = await findEventsByIds(tx, named);
  const found = new Map(namedRows.map((r) => [r.id, r]));
  const existing = new Map(valid.flatMap((e) => { const r = found.get(e.id); return r ? [[e.id, rowToStored(r)] as const] : []; }));
  const knownTargets = new Set(namedRows.filter((r) => r.caseId === caseId).map((r) => r.id));

  let status = locked.status as CaseStatus;
  const accepted: NewEvent[] = [];
  const acceptedById = new Map<string, NewEvent>();
  // For each item: a final result, or an event accepted in this push (its seq is known after the insert);
  // a repeat of it later in the same push is answered 'duplicate' with the same seq.
  type Pending = { pending: string; repeat: boolean };
  const plan = checked.map((c): PushResult | Pending => {
    if (!c.ok) return { id: c.id, status: 'refused', reason: c.reason };
    const e = c.event;
    const refuse = (reason: string): PushResult => ({ id: e.id, status: 'refused', reason });
    const stored = existing.get(e.id);
    if (stored) {
      return sameContent(stored, e) ? { id: e.id, status: 'duplicate', seq: stored.seq, receivedAt: stored.receivedAt }
        : refuse('This id is already used by a different event; a changed event needs a new id');
    }
    const earlier = acceptedById.get(e.id);
    if (earlier) return sameContent(earlier, e) ? { pending: e.id, repeat: true } : refuse('This id appears twice in the push with different content');
    if (!recorders.has(e.author)) return refuse('The author is not a nurse or endoscopist of this case\'s unit');
    const byStatus = statusRefusal(status, e.kind);
    if (byStatus) return refuse(byStatus);
    const target = targetOf(e);
    if (target && !knownTargets.has(target) && !acceptedById.has(target)) return refuse(`The ${e.kind} names event ${target}, which is not in this case`);
    accepted.push(e);
    acceptedById.set(e.id, e);
    status = statusAfterEvent(status, e.kind);
    return { pending: e.id, repeat: false };
  });

  const inserted = new Map<string, StoredEvent>();
  if (accepted.length) {
    const n = accepted.length;
    const closing = status === 'closed' && locked.status !== 'closed';
    const toInsert = accepted.map((e, k) => eventToRow(e, locked.lastSeq + 1 + k));
    const rows = await insertEventsAndAdvance(tx, caseId, toInsert, status, closing);
    if (rows.length !== n) throw new LostRace();
    const given = new Map(rows.map((r) => [r.id, r]));
    for (const row of toInsert) inserted.set(row.id, insertedToStored(row, given.get(row.id)!));
  }
  const results = plan.map((p): PushResult => {
    if (!('pending' in p)) return p;
    const s = inserted.get(p.pending)!;
    return { id: s.id, status: p.repeat ? 'duplicate' : 'accepted', seq: s.seq, receivedAt: s.receivedAt };
  });
  return { results, stored: [...inserted.values()].sort((a, b) => a.seq - b.seq) };
}

/**
 * One page of a case's events after `afterSeq`, with the case's last sequence and its status as of that
 * sequence. The events are read first and the case after: the case's row (its last sequence and status
 * change together, in the push's UPDATE) is then at least as new as the page, so the status belongs to
 * lastSeq. Read at once, a push committed between the two reads gave a join the status before the push
 * with the last sequence after it, and the tablet kept a recording case as scheduled.
 */
export async function eventsPageWithStatus(db: Tx, caseId: string, afterSeq: number, limit = EVENTS_PAGE_SIZE): Promise<EventsPage & { status: CaseStatus | null }> {
  const rows = await eventsAfter(db, caseId, afterSeq, limit);
  const row = await findCase(db, caseId);
  const events = rows.slice(0, limit).map(rowToStored);
  return { events, lastSeq: Math.max(row?.lastSeq ?? 0, events.at(-1)?.seq ?? 0), hasMore: rows.length > limit, status: (row?.status as CaseStatus | undefined) ?? null };
}

/** One page of a case's events after `afterSeq`, with the case's last sequence (the HTTP read). */
export async function eventsPage(db: Tx, caseId: string, afterSeq: number, limit = EVENTS_PAGE_SIZE): Promise<EventsPage> {
  const { status: _status, ...page } = await eventsPageWithStatus(db, caseId, afterSeq, limit);
  return page;
}
