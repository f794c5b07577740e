import { correctedTimeMs, eventLabels, type EventKind, type NewEvent } from '#shared/schemas/events.ts';
import type { TapState } from '@/sync/outbox.ts';
import { summarizeDetails } from './details.ts';
import { buttonFor } from './vocabulary.ts';

/** One row of the recent-events list: an event as it stands after its voids and amendments. */
export type RecentRow = {
  id: string;
  kind: EventKind;
  label: string;
  detail: string;
  /** Corrected time (server clock), ms. */
  timeMs: number;
  state: TapState;
  /** Tapped on this tablet. */
  mine: boolean;
  authorLabel: string;
  voided: boolean;
  voidReason: string | null;
  amended: boolean;
  /** The payload with every amendment applied in order (what a detail sheet starts from). */
  payload: Record<string, unknown>;
};

export type Corrections = { voids: Map<string, string>; amends: Map<string, Record<string, unknown>> };

/** Voids and amendments by the event they point at, applied in log order (a later amendment wins). */
export function collectCorrections(events: readonly NewEvent[]): Corrections {
  const voids = new Map<string, string>();
  const amends = new Map<string, Record<string, unknown>>();
  for (const e of events) {
    if (e.kind === 'void') voids.set(e.payload.targetId, e.payload.reason);
    else if (e.kind === 'amend') amends.set(e.payload.targetId, { ...amends.get(e.payload.targetId), ...e.payload.fields });
  }
  return { voids, amends };
}

/** Corrected times by event object: an event is immutable, and Date.parse on every render adds up. */
const timeCache = new WeakMap<object, number>();
export function timeOf(e: NewEvent): number {
  let t = timeCache.get(e);
  if (t === undefined) { t = correctedTimeMs(e); timeCache.set(e, t); }
  return t;
}

/** The label of an event in our words: the button's (clip deployed vs misfired), else the kind's. */
export function labelOf(kind: EventKind, payload: Record<string, unknown>): string {
  if (kind === 'time_out' || kind === 'sign_out') return payload.skipped ? `${eventLabels[kind]} skipped` : eventLabels[kind];
  if (kind === 'remark' && typeof payload.text === 'string') return 'Remark';
  return buttonFor(kind, payload)?.label ?? eventLabels[kind];
}

/**
 * The newest `limit` taps (corrections are folded into their targets), newest first by corrected time,
 * ties by id (UUIDv7 ids sort by creation). `stateOf` gives the sync state of an event of this tablet.
 */
export function recentRows(
  events: readonly NewEvent[],
  opts: { limit: number; device: string | null; stateOf: (id: string) => TapState; authorName?: (userId: string) => string; corrections?: Corrections },
): RecentRow[] {
  const { voids, amends } = opts.corrections ?? collectCorrections(events);
  const taps: { e: NewEvent; t: number }[] = [];
  for (const e of events) if (e.kind !== 'void' && e.kind !== 'amend') taps.push({ e, t: timeOf(e) });
  // Newest first. The log comes nearly in time order, so a sort is only paid when it is not in order.
  const newer = (a: { e: NewEvent; t: number }, b: { e: NewEvent; t: number }) => b.t - a.t || (a.e.id < b.e.id ? 1 : -1);
  taps.reverse();
  if (!taps.every((x, i) => i === 0 || newer(taps[i - 1]!, x) <= 0)) taps.sort(newer);
  return taps.slice(0, opts.limit).map(({ e, t }) => {
    const amended = amends.get(e.id);
    const payload = { ...(e.payload as Record<string, unknown>), ...amended };
    const voidReason = voids.get(e.id) ?? null;
    return {
      id: e.id,
      kind: e.kind,
      label: labelOf(e.kind, payload),
      detail: e.kind === 'remark' ? String(payload.text ?? '') : summarizeDetails(e.kind, payload),
      timeMs: t,
      state: opts.stateOf(e.id),
      mine: opts.device !== null && e.device === opts.device,
      authorLabel: opts.authorName?.(e.author) ?? 'other tablet',
      voided: voidReason !== null,
      voidReason,
      amended: Boolean(amended),
      payload,
    };
  });
}
