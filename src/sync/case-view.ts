import type { CaseStatus } from '#shared/schemas/cases.ts';
import type { NewEvent, StoredEvent } from '#shared/schemas/events.ts';
import { statusAfterEvent } from '#shared/domain/case-status.ts';
import { NearDuplicateIndex, type NearDuplicatePair } from '#shared/domain/near-duplicates.ts';
import type { TapState } from './outbox.ts';

/** One line of a case's timeline as the tablet holds it: accepted, or still on its way. */
export type TimelineItem = {
  id: string;
  event: NewEvent;
  state: TapState;
  /** The server's sequence and receipt time, once accepted. */
  seq: number | null;
  receivedAt: string | null;
  /** The server's reason, when refused. */
  reason: string | null;
};

export type CaseSnapshot = {
  caseId: string;
  /** Accepted events by sequence, then this tablet's pending and refused ones in the order they were made. */
  items: readonly TimelineItem[];
  /** Highest sequence the server reported for the case (0 before the first answer). */
  lastSeq: number;
  /** The case's status as last reported (null before the first join answer). */
  status: CaseStatus | null;
  /** True once the events kept on the tablet were read back from IndexedDB. */
  loaded: boolean;
  /** Why joining the case failed (not a member of its unit, say), or null. */
  error: string | null;
  /** Same-kind taps from two tablets within seconds, neither voided: for a person to resolve. */
  nearDuplicates: readonly NearDuplicatePair[];
};

/** What the engine holds for one case. */
export class CaseState {
  readonly stored = new Map<string, StoredEvent>();
  /** Highest n such that sequences 1..n are all held: the `afterSeq` to ask from. */
  contiguousSeq = 0;
  lastSeq = 0;
  status: CaseStatus | null = null;
  loaded = false;
  error: string | null = null;
  refs = 0;
  /** The accepted events as timeline lines, by sequence: kept in order as events arrive, never re-sorted. */
  readonly accepted: TimelineItem[] = [];
  readonly nearDuplicates = new NearDuplicateIndex();
  private seqs = new Set<number>();
  private maxHeld = 0;

  constructor(readonly caseId: string) {}

  /** Add accepted events; returns those not held before. */
  absorb(events: readonly StoredEvent[]): StoredEvent[] {
    const added: StoredEvent[] = [];
    for (const e of events) {
      if (e.caseId !== this.caseId || this.stored.has(e.id)) continue;
      this.stored.set(e.id, e);
      this.seqs.add(e.seq);
      this.maxHeld = Math.max(this.maxHeld, e.seq);
      this.lastSeq = Math.max(this.lastSeq, e.seq);
      this.status = statusAfterEvent(this.status, e.kind);
      added.push(e);
      this.insertAccepted({ id: e.id, event: e, state: 'accepted', seq: e.seq, receivedAt: e.receivedAt, reason: null });
    }
    while (this.seqs.has(this.contiguousSeq + 1)) this.contiguousSeq++;
    return added;
  }

  private insertAccepted(item: TimelineItem): void {
    const list = this.accepted;
    const seq = item.seq!;
    // Mostly the next sequence, appended; an event that arrived out of order goes in its place.
    let i = list.length;
    while (i > 0 && list[i - 1]!.seq! > seq) i--;
    if (i === list.length) list.push(item);
    else list.splice(i, 0, item);
  }

  /** True when a sequence above the contiguous run is held (something in between was missed). */
  get hasGap(): boolean {
    return this.maxHeld > this.contiguousSeq;
  }
}

/** The snapshot of a case: O(n) copying and lookups, no sorting (the accepted lines are kept in order). */
export function buildCaseSnapshot(c: CaseState, pending: readonly TimelineItem[]): CaseSnapshot {
  const mine = pending.filter((p) => !c.stored.has(p.id));
  const items = mine.length ? c.accepted.concat(mine) : c.accepted.slice();
  const live: NewEvent[] = [];
  for (const i of items) if (i.state !== 'refused') live.push(i.event);
  return {
    caseId: c.caseId,
    items,
    lastSeq: c.lastSeq,
    status: c.status,
    loaded: c.loaded,
    error: c.error,
    nearDuplicates: c.nearDuplicates.update(live),
  };
}
