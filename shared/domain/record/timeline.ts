import { applyCorrections } from './corrections.ts';
import { check, compareLog, intake } from './intake.ts';
import { sortByKeys } from './sort.ts';
import type { Problem, TimelineEvent, VoidedEvent } from './types.ts';

/** One shared, frozen empty list for the many events never amended (fewer allocations on long logs). */
const NOT_AMENDED: readonly string[] = Object.freeze([]);

export type EffectiveTimeline = { timeline: TimelineEvent[]; voided: VoidedEvent[]; amendmentsApplied: number };

/**
 * The effective timeline (PRODUCT.md, The record): the append-only log read once per id, in log order,
 * with voids and amendments applied. Corrections themselves are not on it; voided events are listed apart.
 * `onEvent` sees each event as it joins the timeline, while it is in the cache (on long logs a second pass
 * over the timeline costs a cache miss per event).
 */
export function effectiveTimeline(events: unknown, problems: Problem[], onEvent?: (e: TimelineEvent) => void): EffectiveTimeline {
  const log = intake(events, problems);
  const sorted = sortByKeys(log.entries, log.times, compareLog);
  const amendmentsApplied = applyCorrections(log, problems);
  const timeline: TimelineEvent[] = [];
  const voided: VoidedEvent[] = [];
  for (const e of sorted) {
    if (e.voidedBy) { voided.push({ id: e.id, kind: e.kind, atMs: e.atMs, voidedBy: e.voidedBy }); continue; }
    check(e);
    if (e.status !== 'ok') {
      problems.push({ code: e.status as 'unknown_kind' | 'invalid_payload', eventId: e.id, message: `event ${e.id} (${e.kind.slice(0, 40)}) left out: ${e.issue}` });
      continue;
    }
    if (e.kind === 'void' || e.kind === 'amend') continue;
    const event = {
      id: e.id, kind: e.kind, atMs: e.atMs, seq: e.seq, author: e.author, device: e.device, payload: e.payload, amendedBy: e.amendedBy ?? NOT_AMENDED,
    } as TimelineEvent;
    timeline.push(event);
    onEvent?.(event);
  }
  return { timeline, voided, amendmentsApplied };
}
