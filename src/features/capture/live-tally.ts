import { buildRecord } from '#shared/domain/record/index.ts';
import { roundMl } from '#shared/domain/record/counts.ts';
import { isEventKind, validatePayload } from '#shared/domain/record/intake.ts';
import type { CaseRecord, RecordEventInput } from '#shared/domain/record/types.ts';
import { boardMl, latestOpenBleed, toLiveCounts, type LiveCounts } from './live-counts.ts';

/**
 * The board's figures kept up to date tap by tap, without rebuilding the whole record on each one.
 *
 * The figures are those of `buildRecord` (the one reducer the tablet and the server share): a tally is
 * made from a full record, and extended when the new log is the old one with events appended that
 * change the figures in a way known in advance: a valid tap that is not a bleed, a haemostasis, a void or
 * an amendment, is not named by any correction, and comes last in the log's order. Anything else (a
 * correction, a bleed, an event out of order, an event changed other than by the server's seq) rebuilds
 * the record. The property test in
 * tests/client/capture-live-tally.test.ts checks that both ways give the same figures.
 */
export type LiveTally = {
  /** The reducer's input this tally is for (compared by identity, event by event). */
  readonly inputs: readonly RecordEventInput[];
  /** The figures, with the open bleed's start on the corrected (server) clock. */
  readonly counts: LiveCounts;
  /** The bleed a haemostasis tap now belongs to (latestOpenBleed of the record). */
  readonly openBleed: { bleedId: string; startMs: number } | null;
  /** The injected volume as the reducer sums it (timeline order, before rounding). */
  readonly ml: number;
  /** The last event of the timeline, in log order: an appended event must sort after it. */
  readonly last: LogKey | null;
  /**
   * The events seen by id, the times held by more than one event, and the ids named by corrections.
   * Shared by a tally and those extended from it and only ever grown, so at worst they force a rebuild.
   */
  readonly ids: Map<string, RecordEventInput>;
  readonly tied: Set<number>;
  /** Ids delivered more than once: which delivery the reducer keeps can change with a server copy. */
  readonly repeated: Set<string>;
  readonly named: Set<string>;
  readonly times: Map<number, RecordEventInput>;
};

function seeTime(times: Map<number, RecordEventInput>, tied: Set<number>, e: RecordEventInput): void {
  const before = times.get(e.atMs);
  if (!before) times.set(e.atMs, e);
  else if (before !== e) tied.add(e.atMs);
}

const seqOf = (e: RecordEventInput) => (typeof e.seq === 'number' && Number.isFinite(e.seq) ? e.seq : null);

/**
 * The server's copy of an event this tablet made: a new object, the same id, kind, time, author,
 * device and payload, and now a seq. It reads the same to the reducer, except that seq orders events
 * of the same corrected time, so it is taken as the same event only when no other event has that time.
 */
function sameEventForTally(t: LiveTally, a: RecordEventInput, b: RecordEventInput): boolean {
  return a.id === b.id && a.kind === b.kind && a.atMs === b.atMs && !t.tied.has(a.atMs) && !t.repeated.has(a.id)
    && (a.author ?? null) === (b.author ?? null) && (a.device ?? null) === (b.device ?? null)
    && JSON.stringify(a.payload) === JSON.stringify(b.payload);
}

type LogKey = { atMs: number; seq: number | null; id: string };

/** True when `b` comes after `a` in the reducer's log order: corrected time, then seq (none last), then id. */
const comesAfter = (a: LogKey, b: LogKey) =>
  a.atMs !== b.atMs ? b.atMs > a.atMs : (a.seq ?? Infinity) !== (b.seq ?? Infinity) ? (b.seq ?? Infinity) > (a.seq ?? Infinity) : b.id > a.id;

/** Kinds whose tap changes the board by a fixed step (see `step`); the others leave it as it is. */
const REBUILD_KINDS = new Set(['bleed', 'haemostasis', 'void', 'amend']);


/** A tally from the full record of `inputs`. */
export function tallyFromRecord(inputs: readonly RecordEventInput[], record: CaseRecord): LiveTally {
  let ml = 0;
  for (const e of record.timeline) if (e.kind === 'injection') ml += e.payload.volumeMl ?? 0;
  const open = latestOpenBleed(record);
  const ids = new Map<string, RecordEventInput>();
  const tied = new Set<number>();
  const named = new Set<string>();
  const repeated = new Set<string>();
  const times = new Map<number, RecordEventInput>();
  for (const e of inputs) {
    if (ids.has(e.id)) repeated.add(e.id);
    ids.set(e.id, e);
    seeTime(times, tied, e);
    if (e.kind === 'void' || e.kind === 'amend') {
      const target = (e.payload as { targetId?: unknown } | undefined)?.targetId;
      if (typeof target === 'string') named.add(target);
    }
  }
  const last = record.timeline.at(-1);
  return {
    inputs, ml, ids, tied, named, repeated, times,
    openBleed: open ? { bleedId: open.bleedId, startMs: open.startMs } : null,
    last: last ? { atMs: last.atMs, seq: last.seq, id: last.id } : null,
    counts: toLiveCounts(record, 0), // offset 0: the open bleed's start stays on the corrected clock
  };
}

/** The tally extended by one appended event, or null when that event needs the record rebuilt. */
function step(t: LiveTally, e: RecordEventInput): LiveTally | null {
  const seen = t.ids.get(e.id);
  // An id seen before (another delivery, or the same object again) is a repeat: the reducer decides which counts.
  if (REBUILD_KINDS.has(e.kind) || !isEventKind(e.kind) || seen !== undefined || t.named.has(e.id)) return null;
  if (typeof e.id !== 'string' || e.id.length === 0 || e.id.length > 64 || !Number.isFinite(e.atMs)) return null;
  const checked = validatePayload(e.kind, e.payload === undefined ? {} : e.payload);
  t.ids.set(e.id, e);
  seeTime(t.times, t.tied, e);
  // An invalid payload is left out of the record (reported in its problems): the figures stay.
  if (!checked.ok) return t;
  const key = { atMs: e.atMs, seq: seqOf(e), id: e.id };
  if (t.last && !comesAfter(t.last, key)) return null;
  const p = checked.data;
  const c = { ...t.counts };
  let ml = t.ml;
  if (e.kind === 'clip_fired') { if (p.outcome === 'deployed') c.clipsDeployed++; else c.clipsMisfired++; }
  else if (e.kind === 'loop_placed') c.loopsPlaced++;
  else if (e.kind === 'injection') { ml += (p.volumeMl as number | undefined) ?? 0; c.injectionMl = boardMl(roundMl(ml)); }
  return { ...t, counts: c, ml, last: key };
}

/**
 * The tally for `inputs`: `prev` extended when `inputs` starts with `prev.inputs` (the same events,
 * or the server's copies of them) and every appended event can be stepped; else made from `build()`.
 */
export function nextTally(prev: LiveTally | null, inputs: readonly RecordEventInput[], build: () => CaseRecord = () => buildRecord(inputs)): LiveTally {
  if (prev && prev.inputs === inputs) return prev;
  let t = prev ? extended(prev, inputs) : null;
  for (let i = prev ? prev.inputs.length : 0; t && i < inputs.length; i++) t = step(t, inputs[i]!);
  return t ? { ...t, inputs } : tallyFromRecord(inputs, build());
}

/** `t` if `after` starts with its events (the last one's seq brought up to date), else null. */
function extended(t: LiveTally, after: readonly RecordEventInput[]): LiveTally | null {
  const before = t.inputs;
  if (after.length < before.length) return null;
  let last = t.last;
  for (let i = 0; i < before.length; i++) {
    const a = before[i]!;
    const b = after[i]!;
    if (a === b) continue;
    if (!sameEventForTally(t, a, b)) return null;
    t.ids.set(b.id, b);
    if (last?.id === b.id) last = { ...last, seq: seqOf(b) };
  }
  return last === t.last ? t : { ...t, last };
}
