import { v7 as uuidv7 } from 'uuid';
import type { EventKind, NewEvent, NewEventOf, PayloadOf, StoredEvent } from '#shared/schemas/events.ts';

/** Invented defaults for a test event; every field can be overridden. */
const defaults = { offsetMs: 0, offsetUncertaintyMs: 5, author: 'user-test-nurse', device: 'tablet-a' };

/** A valid new event of `kind` (payload defaults to the minimal valid one for that kind). */
export function buildEvent<K extends EventKind>(kind: K, over: Partial<Omit<NewEventOf<K>, 'kind'>> & { caseId: string }): NewEventOf<K> {
  return {
    id: uuidv7(),
    deviceTime: new Date('2025-03-14T09:00:00.000Z').toISOString(),
    ...defaults,
    kind,
    payload: minimalPayload(kind),
    ...over,
  } as NewEventOf<K>;
}

/** A stored event: a new event with its sequence number and receipt time. */
export function buildStored<K extends EventKind>(kind: K, over: Partial<Omit<NewEventOf<K>, 'kind'>> & { caseId: string; seq: number }): StoredEvent {
  const { seq, ...rest } = over;
  return { ...buildEvent(kind, rest), seq, receivedAt: new Date('2025-03-14T09:00:01.000Z').toISOString() } as StoredEvent;
}

/** The smallest payload each kind accepts (required fields only). */
export function minimalPayload<K extends EventKind>(kind: K): PayloadOf<K> {
  const required: Partial<Record<EventKind, unknown>> = {
    haemostasis: { achieved: true },
    clip_fired: { outcome: 'deployed' },
    remark: { text: 'Test remark' },
    void: { targetId: uuidv7(), reason: 'Tapped twice' },
    amend: { targetId: uuidv7(), fields: {} },
  };
  return (required[kind] ?? {}) as PayloadOf<K>;
}

/** Device time `ms` after a base instant, ISO. */
export const at = (ms: number, base = Date.parse('2025-03-14T09:00:00.000Z')) => new Date(base + ms).toISOString();

export type { NewEvent };
