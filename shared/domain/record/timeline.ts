import { applyCorrections } from './corrections.ts';
import { compareLog, intake, type LogEntry } from './intake.ts';
import { sortByKey } from './sort.ts';
import type { Problem, TimelineEvent, VoidedEvent } from './types.ts';

const atMsOf = (e: LogEntry) => e.atMs;

/** One shared, frozen empty list for the many events never amended (fewer allocations on long logs). */
const NOT_AMENDED: readonly string[] = Object.freeze([]);

export type EffectiveTimeline = { timeline: TimelineEvent[]; voided: VoidedEvent[]; amendmentsApplied: number };

/**
 * The effective timeline (PRODUCT.md, The record): the append-only log read once per id, in log order,
 * with voids and amendments applied. Corrections themselves are not on it; voided events are listed apart.
 */
export function effectiveTimeline(events: unknown, problems: Problem[]): EffectiveTimeline {
  const log = intake(events, problems);
  const sorted = sortByKey(log.entries, atMsOf, compareLog);
  const amendmentsApplied = applyCorrections(log, problems);
  const timeline: TimelineEvent[] = [];
  const voided: VoidedEvent[] = [];
  for (const e of sorted) {
    if (e.voidedBy) { voided.push({ id: e.id, kind: e.kind, atMs: e.atMs, voidedBy: e.voidedBy }); continue; }
    if (e.kind === 'void' || e.kind === 'amend' || e.status !== 'ok') continue;
    timeline.push({
      id: e.id, kind: e.kind, atMs: e.atMs, seq: e.seq, author: e.author, device: e.device, payload: e.payload, amendedBy: e.amendedBy ?? NOT_AMENDED,
    } as TimelineEvent);
  }
  return { timeline, voided, amendmentsApplied };
}
