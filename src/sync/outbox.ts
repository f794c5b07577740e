import { z } from 'zod';
import { eventEnvelopeSchema, newEventSchema, type NewEvent } from '#shared/schemas/events.ts';

const newEvent = newEventSchema as unknown as z.ZodType<NewEvent>;

/**
 * The outbox: every event made on this tablet that the server has not yet accepted. An entry leaves it
 * only when the server answered 'accepted' or 'duplicate' (the event is then in the case's log), or when a
 * person replaced or discarded a refused one (and that is written to the audit store and, for a discard,
 * recorded as a remark event). Nothing else ever removes an entry.
 *
 * Stored states: 'queued' (to send) and 'refused' (answered with a reason; waits for a person).
 * In memory only: 'saving' (before the IndexedDB write committed) and 'sent' (in flight, awaiting the ack);
 * a 'sent' entry found after a reload is simply 'queued' again (at-least-once delivery).
 */
export const outboxEntrySchema = z.object({
  event: newEvent,
  state: z.enum(['queued', 'refused']),
  /** The server's reason, for a refused entry. */
  reason: z.string().nullable(),
  /** Push attempts without an answer so far (for the back-off and for the screen). */
  attempts: z.number().int().min(0),
  /** Set on the remark that records a discard: discarding it again writes only the audit entry. */
  discardOf: z.string().nullable(),
});
export type OutboxEntry = z.infer<typeof outboxEntrySchema>;

/**
 * An outbox row that no longer passes `outboxEntrySchema` (written by an earlier version whose payload
 * rules were looser, say), taken back as a refused entry with the reason, so that a person fixes or
 * discards it: never sent as it is, never hidden. Null when even its envelope cannot be read (such a row
 * is left in IndexedDB untouched).
 */
export function keptOutboxEntry(row: unknown, error: z.ZodError): OutboxEntry | null {
  const r = (typeof row === 'object' && row !== null ? row : {}) as Record<string, unknown>;
  const event = eventEnvelopeSchema.safeParse(r.event);
  if (!event.success) return null;
  const issues = error.issues.slice(0, 3).map((i) => `${i.path.slice(1).join('.') || 'event'}: ${i.message}`).join('; ');
  return {
    event: event.data as NewEvent,
    state: 'refused',
    reason: `Kept on this tablet, but this version of Ledgerline does not take it as it is (${issues}); fix or discard it`,
    attempts: typeof r.attempts === 'number' && Number.isInteger(r.attempts) && r.attempts >= 0 ? r.attempts : 0,
    discardOf: typeof r.discardOf === 'string' ? r.discardOf : null,
  };
}

/** States a tap goes through on the screen. */
export type TapState = 'saving' | 'queued' | 'sent' | 'accepted' | 'refused';

/** What the tablet remembers of a person's decision about a refused event. */
export type AuditEntry = {
  action: 'discarded' | 'replaced';
  /** The refused event, in full. */
  event: NewEvent;
  reason: string | null;
  /** Who decided (user id), when (ISO), and why (their words). */
  by: string;
  at: string;
  why: string;
  /** The remark that records a discard, or the new event that replaced it. */
  recordedAs: string | null;
};

export function newOutboxEntry(event: NewEvent, discardOf: string | null = null): OutboxEntry {
  return { event, state: 'queued', reason: null, attempts: 0, discardOf };
}
