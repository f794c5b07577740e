import { eventLabels, newEventSchema, type EventKind, type NewEvent } from '#shared/schemas/events.ts';

/** What a person may change when fixing a refused event before it is sent again as a new event. */
export type ResubmitChanges = {
  caseId?: string;
  kind?: EventKind;
  payload?: unknown;
  /** When it happened, if the refused one had it wrong; by default the original tap's time is kept. */
  deviceTime?: string;
};

/**
 * The replacement of a refused event: a new id, the person fixing it as author, the original's time and
 * clock offset kept (it records when the thing happened), the changes applied. Checked against the
 * event schema, so a fix that is still invalid throws (a ZodError naming the field) and nothing is queued.
 */
export function rebuildEvent(original: NewEvent, changes: ResubmitChanges, fresh: { id: string; author: string }): NewEvent {
  const kind = changes.kind ?? original.kind;
  return newEventSchema.parse({
    ...original,
    id: fresh.id,
    author: fresh.author,
    caseId: changes.caseId ?? original.caseId,
    deviceTime: changes.deviceTime ?? original.deviceTime,
    kind,
    payload: changes.payload ?? (kind === original.kind ? original.payload : {}),
  }) as NewEvent;
}

const REMARK_MAX = 2000;

/** The words of the remark that records a discard (our own wording), cut to the remark's limit. */
export function discardRemarkText(event: NewEvent, reason: string | null, why: string): string {
  const text = `Discarded on a tablet without being recorded: "${eventLabels[event.kind]}" tapped at ${event.deviceTime} `
    + `(event ${event.id}, payload ${JSON.stringify(event.payload)}). Refused by the server: ${reason ?? 'no reason given'}. `
    + `Why discarded: ${why.trim() || 'no reason given'}.`;
  return text.length <= REMARK_MAX ? text : `${text.slice(0, REMARK_MAX - 1)}…`;
}
