import { correctedTimeMs, type EventKind, type NewEvent } from '../schemas/events.ts';

/**
 * Near-duplicate taps: the same kind of event tapped on two tablets within a few seconds of each other
 * (corrected time), as when the nurse and a colleague both record "clip fired" for one clip. They are
 * reported as pairs for a person to resolve (void one, or confirm both); never merged or dropped here.
 */

/** Default window, ms: two taps of one thing by two people land within a few seconds (common practice). */
export const NEAR_DUPLICATE_WINDOW_MS = 5_000;

/** Corrections point at other events; two of them are never "the same tap". */
const notTaps: ReadonlySet<EventKind> = new Set(['void', 'amend']);

export type NearDuplicatePair<E extends NewEvent = NewEvent> = {
  /** Stable key of the pair (the two ids in order), to remember a person's decision. */
  key: string;
  /** The earlier of the two by corrected time. */
  first: E;
  second: E;
  /** Corrected-time distance between the two, ms. */
  gapMs: number;
};

export function nearDuplicateKey(a: string, b: string): string {
  return a < b ? `${a}|${b}` : `${b}|${a}`;
}

export type NearDuplicateOptions = {
  windowMs?: number;
  /** Keys of pairs a person already confirmed as two real events. */
  resolved?: ReadonlySet<string>;
};

/**
 * All pairs of events of the same kind from different devices whose corrected times are at most
 * `windowMs` apart, neither voided. Sorted by the first event's corrected time. A sliding window over
 * the events sorted by corrected time keeps this O(n log n + pairs).
 */
export function findNearDuplicates<E extends NewEvent>(events: readonly E[], options: NearDuplicateOptions = {}): NearDuplicatePair<E>[] {
  const windowMs = options.windowMs ?? NEAR_DUPLICATE_WINDOW_MS;
  const voided = new Set(events.flatMap((e) => (e.kind === 'void' ? [e.payload.targetId] : [])));
  const taps = events
    .filter((e) => !notTaps.has(e.kind) && !voided.has(e.id))
    .map((e) => ({ e, t: correctedTimeMs(e) }))
    .sort((a, b) => a.t - b.t || (a.e.id < b.e.id ? -1 : 1));

  const pairs: NearDuplicatePair<E>[] = [];
  for (let i = 0; i < taps.length; i++) {
    const a = taps[i]!;
    for (let j = i + 1; j < taps.length && taps[j]!.t - a.t <= windowMs; j++) {
      const b = taps[j]!;
      if (b.e.kind !== a.e.kind || b.e.device === a.e.device) continue;
      const key = nearDuplicateKey(a.e.id, b.e.id);
      if (options.resolved?.has(key)) continue;
      pairs.push({ key, first: a.e, second: b.e, gapMs: b.t - a.t });
    }
  }
  return pairs;
}

type Member<E> = { e: E; t: number };
const before = <E extends NewEvent>(a: Member<E>, b: Member<E>) => a.t - b.t || (a.e.id < b.e.id ? -1 : a.e.id > b.e.id ? 1 : 0);

/**
 * The same pairs as findNearDuplicates, kept up to date as a log grows: `update(events)` with the whole
 * current log costs one pass of lookups, and a new event is only compared with its neighbours in time
 * (a binary search into the taps sorted by corrected time). A log that lost events (an event refused)
 * is computed again from scratch. The array returned keeps its identity while the pairs are the same.
 */
export class NearDuplicateIndex<E extends NewEvent = NewEvent> {
  private readonly windowMs: number;
  private readonly seen = new Set<string>();
  private readonly voided = new Set<string>();
  /** The taps not voided, by id and sorted by (corrected time, id). */
  private readonly members = new Map<string, Member<E>>();
  private sorted: Member<E>[] = [];
  private readonly pairKeys = new Map<string, [string, string]>();
  private pairs: NearDuplicatePair<E>[] = [];
  private dirty = false;

  constructor(windowMs = NEAR_DUPLICATE_WINDOW_MS) { this.windowMs = windowMs; }

  update(events: readonly E[]): readonly NearDuplicatePair<E>[] {
    let held = 0;
    for (const e of events) if (this.seen.has(e.id)) held++;
    if (held < this.seen.size) this.reset();
    for (const e of events) {
      if (!this.seen.has(e.id)) { this.add(e); continue; }
      const m = this.members.get(e.id);
      if (m && m.e !== e) { m.e = e; if (this.pairKeys.size) this.dirty = true; } // the same event, now as stored by the server
    }
    if (this.dirty) this.materialize();
    return this.pairs;
  }

  private reset(): void {
    this.seen.clear();
    this.voided.clear();
    this.members.clear();
    this.sorted = [];
    this.pairKeys.clear();
    this.dirty = true;
  }

  private add(e: E): void {
    this.seen.add(e.id);
    if (e.kind === 'void') {
      const target = e.payload.targetId;
      this.voided.add(target);
      if (this.members.delete(target)) {
        this.sorted = this.sorted.filter((m) => m.e.id !== target);
        for (const [key, ids] of this.pairKeys) if (ids.includes(target)) this.pairKeys.delete(key);
        this.dirty = true;
      }
      return;
    }
    if (notTaps.has(e.kind) || this.voided.has(e.id)) return;
    const m: Member<E> = { e, t: correctedTimeMs(e) };
    // Binary search for the first member after m; the log comes nearly in time order, so mostly the end.
    let lo = 0;
    let hi = this.sorted.length;
    while (lo < hi) { const mid = (lo + hi) >> 1; if (before(this.sorted[mid]!, m) < 0) lo = mid + 1; else hi = mid; }
    this.sorted.splice(lo, 0, m);
    this.members.set(e.id, m);
    for (let i = lo - 1; i >= 0 && m.t - this.sorted[i]!.t <= this.windowMs; i--) this.pairWith(this.sorted[i]!, m);
    for (let j = lo + 1; j < this.sorted.length && this.sorted[j]!.t - m.t <= this.windowMs; j++) this.pairWith(m, this.sorted[j]!);
  }

  private pairWith(a: Member<E>, b: Member<E>): void {
    if (a.e.kind !== b.e.kind || a.e.device === b.e.device) return;
    this.pairKeys.set(nearDuplicateKey(a.e.id, b.e.id), [a.e.id, b.e.id]);
    this.dirty = true;
  }

  /** The pairs in findNearDuplicates' order: by the first event, then by the second. */
  private materialize(): void {
    this.dirty = false;
    const out: { p: NearDuplicatePair<E>; a: Member<E>; b: Member<E> }[] = [];
    for (const [key, [x, y]] of this.pairKeys) {
      const a = this.members.get(x)!;
      const b = this.members.get(y)!;
      out.push({ p: { key, first: a.e, second: b.e, gapMs: b.t - a.t }, a, b });
    }
    out.sort((u, v) => before(u.a, v.a) || before(u.b, v.b));
    this.pairs = out.map((o) => o.p);
  }
}
