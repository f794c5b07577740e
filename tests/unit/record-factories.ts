import { v7 as uuidv7 } from 'uuid';
import type { EventKind, PayloadOf } from '#shared/schemas/events.ts';
import type { RecordEventInput } from '#shared/domain/record/index.ts';

/** 08:00 UTC on an invented day; every log in the tests is timed from it. */
export const T0 = Date.UTC(2025, 2, 4, 8, 0, 0);
export const minutes = (m: number) => T0 + Math.round(m * 60_000);

type TapOptions = { seq?: number | null; id?: string; author?: string };

/**
 * A case log written tap by tap: `tap(minute, kind, payload)` adds an event that many minutes after T0
 * and returns its id. Sequence numbers follow the order of the taps unless given.
 */
export function caseLog() {
  const events: RecordEventInput[] = [];
  let seq = 0;
  function tap<K extends EventKind>(minute: number, kind: K, payload: PayloadOf<K>, options: TapOptions = {}): string {
    const atMs = minutes(minute);
    const id = options.id ?? uuidv7({ msecs: atMs });
    events.push({ id, kind, atMs, seq: options.seq === undefined ? ++seq : options.seq, payload, author: options.author ?? 'nurse-1', device: 'tablet-1' });
    return id;
  }
  /** An event the vocabulary would refuse (for problem reports). */
  function raw(minute: number, kind: string, payload: unknown, options: TapOptions = {}): string {
    const atMs = minutes(minute);
    const id = options.id ?? uuidv7({ msecs: atMs });
    events.push({ id, kind, atMs, seq: options.seq === undefined ? ++seq : options.seq, payload, author: 'nurse-1', device: 'tablet-1' });
    return id;
  }
  return { events, tap, raw };
}

/** A short, complete case: scope in at 0, scope out at `outAt` minutes. */
export function scopedCase(outAt = 60) {
  const log = caseLog();
  log.tap(-5, 'time_out', { items: [{ key: 'identity', answer: 'yes' }] });
  log.tap(0, 'scope_in', {});
  return { ...log, close: () => log.tap(outAt, 'scope_out', {}) };
}

/** Deterministic Fisher–Yates shuffle (mulberry32), for delivery-order tests. */
export function shuffled<T>(xs: readonly T[], seed: number): T[] {
  let a = seed >>> 0;
  const rnd = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = Math.imul(a ^ (a >>> 15), a | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const out = [...xs];
  for (let i = out.length - 1; i > 0; i--) {
    const j = Math.floor(rnd() * (i + 1));
    [out[i], out[j]] = [out[j]!, out[i]!];
  }
  return out;
}
