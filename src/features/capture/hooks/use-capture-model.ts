import { useMemo, useRef } from 'react';
import { buildRecord, toRecordInput } from '#shared/domain/record/index.ts';
import type { CaseRecord, RecordEventInput } from '#shared/domain/record/types.ts';
import type { NewEvent } from '#shared/schemas/events.ts';
import type { CaseSnapshot, TapState } from '@/sync/index.ts';
import { clockView, sameClock, type ClockView } from '../components/case-clock.tsx';
import { sameCounts, toLiveCounts, type LiveCounts } from '../live-counts.ts';
import { collectCorrections, recentRows, type RecentRow } from '../rows.ts';

/** Rows drawn in the recent list (a few screens of it); the whole log is on the record page. */
export const RECENT_LIMIT = 12;

export type CaptureModel = {
  /** The events that count (everything but what the server refused), as the record reads them. */
  events: readonly NewEvent[];
  record: CaseRecord;
  counts: LiveCounts;
  clock: ClockView;
  rows: RecentRow[];
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

/**
 * The same events in the same order. An event keeps its id and content from the tap to the server's
 * copy (which only adds seq and receivedAt, not read on this screen), so an acceptance does not
 * rebuild the record, the counts or the rows.
 */
const sameEvents = (a: readonly NewEvent[], b: readonly NewEvent[]) => a.length === b.length && a.every((e, i) => e === b[i] || e.id === b[i]!.id);

/**
 * Everything the capture screen shows, computed from the tablet's copy of the case. The record is
 * rebuilt only when the events themselves change (not on every sync-state change of a tap: saving,
 * queued, sent, accepted), and the board and clock keep their identity while their figures hold.
 */
export function useCaptureModel(snapshot: CaseSnapshot, opts: { offsetMs: number; device: string | null; authorName: (id: string) => string }): CaptureModel {
  const { items } = snapshot;
  const fresh = useMemo(() => items.filter((i) => i.state !== 'refused').map((i) => i.event), [items]);
  const events = useStable<readonly NewEvent[]>(fresh, sameEvents);
  const shown = useStable<readonly NewEvent[]>(useMemo(() => items.map((i) => i.event), [items]), sameEvents);
  const record = useMemo(() => buildRecord(events.map(recordInput)), [events]);
  const counts = useStable(useMemo(() => toLiveCounts(record, opts.offsetMs), [record, opts.offsetMs]), sameCounts);
  const clock = useStable(useMemo(() => clockView(record), [record]), sameClock);
  const corrections = useMemo(() => collectCorrections(events), [events]);
  const { device, authorName } = opts;
  // The rows are rebuilt only when the events change; a change of sync state only restamps the rows.
  const base = useMemo(
    () => recentRows(shown, { limit: RECENT_LIMIT, device, authorName, corrections, stateOf: () => 'accepted' }),
    [shown, device, authorName, corrections],
  );
  const stamped = useRef(new Map<string, RecentRow>());
  const rows = useMemo(() => {
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
  return { events, record, counts, clock, rows };
}

const sameBase = (a: RecentRow, b: RecentRow) =>
  a.label === b.label && a.detail === b.detail && a.timeMs === b.timeMs && a.voided === b.voided && a.voidReason === b.voidReason
  && a.amended === b.amended && a.authorLabel === b.authorLabel && a.mine === b.mine;
