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
