import { applyCorrections } from './corrections.ts';
import { check, compareLog, intake, type Intake } from './intake.ts';
import { sortByKeys } from './sort.ts';
import type { Problem, TimelineEvent, VoidedEvent } from './types.ts';

/** One shared, frozen empty list for the many events never amended (fewer allocations on long logs). */
const NOT_AMENDED: readonly string[] = Object.freeze([]);

export type EffectiveTimeline = { timeline: TimelineEvent[]; voided: VoidedEvent[]; amendmentsApplied: number };

export type TimelineHooks = {
  /** Sees each event as it joins the timeline. */
  onEvent?: (e: TimelineEvent) => void;
  /**
   * Told, once the corrections are applied and before the first event joins, how to ask of any id
   * whether its event will be on the timeline and of what kind (a haemostasis may name a bleed that
   * joins after it).
   */
  onCorrected?: (kindOf: (id: string) => string | null) => void;
};

/** The kind of the event `id` if it is on the effective timeline (held, valid, not voided, not a correction), else null. */
function kindOnTimeline(log: Intake, id: string): string | null {
  const e = log.byId.get(id);
  if (!e || e.voidedBy) return null;
  check(e);
  return e.status === 'ok' && e.kind !== 'void' && e.kind !== 'amend' ? e.kind : null;
}

/**
 * The effective timeline (PRODUCT.md, The record): the append-only log read once per id, in log order,
 * with voids and amendments applied. Corrections themselves are not on it; voided events are listed apart.
 * `hooks.onEvent` sees each event as it joins the timeline, while it is in the cache (on long logs a second
 * pass over the timeline costs a cache miss per event).
 */
export function effectiveTimeline(events: unknown, problems: Problem[], hooks: TimelineHooks = {}): EffectiveTimeline {
  const { onEvent, onCorrected } = hooks;
  const log = intake(events, problems);
  const sorted = sortByKeys(log.entries, log.times, compareLog);
  const amendmentsApplied = applyCorrections(log, problems);
  onCorrected?.((id) => kindOnTimeline(log, id));
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
