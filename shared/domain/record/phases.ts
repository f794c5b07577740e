import type { IdleGap, Phase, PhaseName, ScopeInterval, TimelineEvent } from './types.ts';

const MINUTE_MS = 60_000;
export const DEFAULT_IDLE_GAP_MS = 10 * MINUTE_MS;

/** Scope in → scope out intervals. A second "scope in" while the scope is in, or an "out" while out, is a repeat tap and is ignored. */
export function scopeIntervals(timeline: TimelineEvent[]): ScopeInterval[] {
  const out: ScopeInterval[] = [];
  let open: ScopeInterval | null = null;
  for (const e of timeline) {
    if (e.kind === 'scope_in' && !open) { open = { inMs: e.atMs, outMs: null, inEventId: e.id, outEventId: null }; out.push(open); }
    else if (e.kind === 'scope_out' && open) { open.outMs = e.atMs; open.outEventId = e.id; open = null; }
  }
  return out;
}

/** The kinds that start the resection phase: only the first of them in the timeline is read. */
export const RESECTION_START_KINDS: readonly string[] = ['marking', 'injection', 'incision', 'dissection'];

type Mark = { atMs: number; id: string };
const phase = (name: PhaseName, start: Mark, end: Mark | null): Phase => ({
  name, startMs: start.atMs, endMs: end?.atMs ?? null, minutes: end ? (end.atMs - start.atMs) / MINUTE_MS : null,
  startEventId: start.id, endEventId: end?.id ?? null,
});
const first = (timeline: TimelineEvent[], test: (e: TimelineEvent) => boolean, fromMs = -Infinity): Mark | null => {
  for (const e of timeline) if (e.atMs >= fromMs && test(e)) return e;
  return null;
};
const earliest = (...marks: (Mark | null)[]): Mark | null =>
  marks.reduce<Mark | null>((best, m) => (m && (!best || m.atMs < best.atMs) ? m : best), null);

/**
 * The phases of the case, each from its first start mark to the first end mark at or after it:
 * - total: first scope in → the last scope out (open while the scope is in);
 * - resection: first marking, injection, incision or dissection → resection complete (left out when
 *   every such mark comes after the resection complete: its start was not tapped);
 * - closure: the earliest of closure start, a deployed closure clip or a loop placed (clips and loops
 *   counted only once the resection is complete, when it is) → closure complete;
 * - retrieval: from the resection's end — or, if the scope came out and went back in after it, from that
 *   re-entry — to the first specimen retrieved after the resection's end. Without a resection end it runs
 *   from the last re-entry before the first specimen retrieved, if there is one. Left open (no end) only
 *   while the scope is still in.
 * A phase with no start mark is left out; phases may overlap (closure and retrieval often do).
 */
export function phases(timeline: TimelineEvent[], scopes: ScopeInterval[]): Phase[] {
  const out: Phase[] = [];
  const firstScope = scopes[0];
  if (firstScope) {
    const last = scopes[scopes.length - 1]!;
    const end = last.outMs !== null ? { atMs: last.outMs, id: last.outEventId! } : null;
    out.push(phase('total', { atMs: firstScope.inMs, id: firstScope.inEventId }, end));
  }
  let resectionStart = first(timeline, (e) => RESECTION_START_KINDS.includes(e.kind));
  let resectionEnd = resectionStart ? first(timeline, (e) => e.kind === 'resection_complete', resectionStart.atMs) : first(timeline, (e) => e.kind === 'resection_complete');
  // Every start mark after the resection's end (an injection for a bleed after a cold snare, say): none
  // of them started it, so the resection's start is unknown, and it is over.
  if (resectionStart && !resectionEnd) {
    resectionEnd = first(timeline, (e) => e.kind === 'resection_complete');
    if (resectionEnd) resectionStart = null;
  }
  if (resectionStart) out.push(phase('resection', resectionStart, resectionEnd));

  const afterResection = resectionEnd?.atMs ?? -Infinity;
  const closureStart = earliest(
    first(timeline, (e) => e.kind === 'closure_start'),
    first(timeline, (e) => e.kind === 'clip_fired' && e.payload.outcome === 'deployed' && e.payload.purpose === 'closure', afterResection),
    first(timeline, (e) => e.kind === 'loop_placed', afterResection),
  );
  if (closureStart) out.push(phase('closure', closureStart, first(timeline, (e) => e.kind === 'closure_complete', closureStart.atMs)));

  const retrievalEnd = first(timeline, (e) => e.kind === 'specimen_retrieved', afterResection);
  let retrievalStart: Mark | null = resectionEnd;
  for (const s of scopes.slice(1)) {
    if (s.inMs >= afterResection && (!retrievalEnd || s.inMs <= retrievalEnd.atMs)) retrievalStart = { atMs: s.inMs, id: s.inEventId };
  }
  if (retrievalStart && retrievalEnd && retrievalStart.atMs <= retrievalEnd.atMs) out.push(phase('retrieval', retrievalStart, retrievalEnd));
  // Still to come only while the scope is in: a finished case with no retrieval tapped has no retrieval phase.
  else if (retrievalStart && !retrievalEnd && resectionEnd && scopes.at(-1)?.outMs === null) out.push(phase('retrieval', retrievalStart, null));
  return out;
}

/** Pauses longer than `thresholdMs` between consecutive events while the scope is in (from its scope in to its scope out), one event at a time. */
export class IdleGaps {
  private readonly gaps: IdleGap[] = [];
  private scopeIn = false;
  private previous: TimelineEvent | null = null;

  constructor(private readonly thresholdMs: number) {}

  add(e: TimelineEvent): void {
    const previous = this.previous;
    if (this.scopeIn && previous && e.atMs - previous.atMs > this.thresholdMs) {
      this.gaps.push({ startMs: previous.atMs, endMs: e.atMs, minutes: (e.atMs - previous.atMs) / MINUTE_MS, afterEventId: previous.id, beforeEventId: e.id });
    }
    if (e.kind === 'scope_in') this.scopeIn = true;
    else if (e.kind === 'scope_out') this.scopeIn = false;
    this.previous = e;
  }

  finish(): IdleGap[] {
    return this.gaps;
  }
}
