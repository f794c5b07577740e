import { useCallback, useLayoutEffect, useMemo, useRef } from 'react';
import { buildRecord, toRecordInput } from '#shared/domain/record/index.ts';
import type { CaseRecord, RecordEventInput } from '#shared/domain/record/types.ts';
import type { NewEvent } from '#shared/schemas/events.ts';
import type { CaseSnapshot, TapState } from '@/sync/index.ts';
import { clockView, sameClock, type ClockView } from '../components/case-clock.tsx';
import { sameCounts, type LiveCounts } from '../live-counts.ts';
import { nextTally, type LiveTally } from '../live-tally.ts';
import { collectCorrections, recentRows, type RecentRow } from '../rows.ts';
import { useAfterPaint } from './after-paint.ts';

/** Rows drawn in the recent list (a few screens of it); the whole log is on the record page. */
export const RECENT_LIMIT = 12;

export type CaptureModel = {
  /** The events that count (everything but what the server refused), as the record reads them. */
  events: readonly NewEvent[];
  /**
   * The record, as of the last paint: a tap's own frame shows its count and row without waiting for
   * the record to be rebuilt; the clock, phase and checks follow in the next frame.
   */
  record: CaseRecord;
  /** The record of the events as they are now (built when first asked for; for a sheet that opens). */
  recordNow: () => CaseRecord;
  /** The board's figures, up to date with the events (the same as the record's, see live-tally.ts). */
  counts: LiveCounts;
  clock: ClockView;
  rows: RecentRow[];
  /** The current tally (read by a haemostasis tap for the bleed it belongs to). */
  tally: { readonly current: LiveTally | null };
};

/** Keeps the previous value while `same` says nothing changed, so memoised parts of the screen skip. */
export function useStable<T>(value: T, same: (a: T, b: T) => boolean): T {
  const ref = useRef(value);
  if (!same(ref.current, value)) ref.current = value;
  return ref.current;
}

/** The reducer's input by event object: an event is immutable, and its corrected time is parsed once. */
const inputs = new WeakMap<NewEvent, RecordEventInput>();
function recordInput(e: NewEvent): RecordEventInput {
  let r = inputs.get(e);
  if (!r) { r = toRecordInput(e); inputs.set(e, r); }
  return r;
}

/** One build per reducer input: the tally's rebuild and the record after the paint share it. */
const records = new WeakMap<readonly RecordEventInput[], CaseRecord>();
function recordOf(input: readonly RecordEventInput[]): CaseRecord {
  let r = records.get(input);
  if (!r) { r = buildRecord(input); records.set(input, r); }
  return r;
}

/** The same event objects in the same order (the server's copy of an event is a new object: it adds seq). */
const sameObjects = (a: readonly NewEvent[], b: readonly NewEvent[]) => a.length === b.length && a.every((e, i) => e === b[i]);
/** The same events by id: what the recent list shows of an event does not change when it is accepted. */
const sameEvents = (a: readonly NewEvent[], b: readonly NewEvent[]) => a.length === b.length && a.every((e, i) => e === b[i] || e.id === b[i]!.id);

/**
 * Everything the capture screen shows, computed from the tablet's copy of the case. On a tap only the
 * board's figures and the rows are brought up to date at once (the figures by the tally, one step per
 * tap); the record is rebuilt after the paint. A change of sync state (saving, queued, sent, accepted)
 * only restamps the rows, and the board and clock keep their identity while their figures hold.
 */
export function useCaptureModel(snapshot: CaseSnapshot, opts: { offsetMs: number; device: string | null; authorName: (id: string) => string }): CaptureModel {
  const { items } = snapshot;
  const fresh = useMemo(() => items.filter((i) => i.state !== 'refused').map((i) => i.event), [items]);
  const events = useStable<readonly NewEvent[]>(fresh, sameObjects);
  const live = useStable<readonly NewEvent[]>(fresh, sameEvents);
  const shown = useStable<readonly NewEvent[]>(useMemo(() => items.map((i) => i.event), [items]), sameEvents);
  const input = useMemo(() => events.map(recordInput), [events]);

  // The tally of the last commit (a render that is thrown away leaves it as it was).
  const tallyRef = useRef<LiveTally | null>(null);
  const tally = useMemo(() => nextTally(tallyRef.current, input, () => recordOf(input)), [input]);
  useLayoutEffect(() => { tallyRef.current = tally; }, [tally]);
  const { offsetMs } = opts;
  const counts = useStable(useMemo(() => {
    const since = tally.counts.openBleedSinceMs;
    // The record's times are corrected (server clock), the ticking timer reads the tablet's clock.
    return { ...tally.counts, openBleedSinceMs: since === null ? null : since - offsetMs };
  }, [tally, offsetMs]), sameCounts);

  const settled = useAfterPaint(input);
  const record = useMemo(() => recordOf(settled), [settled]);
  const clock = useStable(useMemo(() => clockView(record), [record]), sameClock);

  const corrections = useMemo(() => collectCorrections(live), [live]);
  const { device, authorName } = opts;
  // The rows are rebuilt only when the events change; a change of sync state only restamps the rows.
  // One row more than is kept: the row a tap pushes off the end goes in the frame after the tap's own.
  const base = useMemo(
    () => recentRows(shown, { limit: RECENT_LIMIT + 1, device, authorName, corrections, stateOf: () => 'accepted' }),
    [shown, device, authorName, corrections],
  );
  const stamped = useRef(new Map<string, RecentRow>());
  const stampedAll = useMemo(() => {
    // Accepted events come first in the snapshot and this tablet's pending ones after them: only the
    // tail can hold a state other than 'accepted'.
    const states = new Map<string, TapState>();
    for (let k = items.length - 1; k >= 0 && items[k]!.state !== 'accepted'; k--) states.set(items[k]!.id, items[k]!.state);
    const next = new Map<string, RecentRow>();
    const out = base.map((r) => {
      const state = states.get(r.id) ?? 'accepted';
      const before = stamped.current.get(r.id);
      const row = before && before.state === state && sameBase(before, r) ? before : { ...r, state };
      next.set(r.id, row);
      return row;
    });
    stamped.current = next;
    return out;
  }, [base, items]);
  const newest = stampedAll[0]?.id ?? null;
  const paintedNewest = useAfterPaint(newest);
  const rows = useMemo(() => stampedAll.slice(0, newest === paintedNewest ? RECENT_LIMIT : RECENT_LIMIT + 1), [stampedAll, newest, paintedNewest]);
  const recordNow = useCallback(() => recordOf(input), [input]);
  return { events, record, recordNow, counts, clock, rows, tally: tallyRef };
}

const sameBase = (a: RecentRow, b: RecentRow) =>
  a.label === b.label && a.detail === b.detail && a.timeMs === b.timeMs && a.voided === b.voided && a.voidReason === b.voidReason
  && a.amended === b.amended && a.authorLabel === b.authorLabel && a.mine === b.mine;
