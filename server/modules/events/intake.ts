import { unstorableIn } from '#server/http/storable.ts';
import { jsonBytes, MAX_EVENT_BYTES, toIssues } from '#shared/contracts/sync.ts';
import { newEventSchema, type NewEvent, type StoredEvent } from '#shared/schemas/events.ts';
import type { EventRow, NewEventRow } from './queries.ts';

/**
 * The first, stateless check of each pushed item: size, schema, case. What passes is an event; what
 * fails carries the reason the tablet will show. No database here.
 */
export type Checked = { ok: true; event: NewEvent } | { ok: false; id: string | null; reason: string };

export function checkItem(item: unknown, caseId: string): Checked {
  const id = typeof (item as { id?: unknown })?.id === 'string' ? String((item as { id: string }).id).slice(0, 64) : null;
  const unstorable = unstorableIn(item);
  if (unstorable) return { ok: false, id, reason: `Invalid event: ${unstorable.path}: ${unstorable.message}` };
  const bytes = jsonBytes(item);
  if (bytes > MAX_EVENT_BYTES) return { ok: false, id, reason: `The event is ${bytes} bytes; at most ${MAX_EVENT_BYTES} are accepted` };
  const parsed = newEventSchema.safeParse(item);
  if (!parsed.success) {
    const issues = toIssues(parsed.error);
    const first = issues[0];
    const more = issues.length > 1 ? ` (and ${issues.length - 1} more)` : '';
    return { ok: false, id, reason: `Invalid event: ${first?.path || '(root)'}: ${first?.message ?? 'invalid'}${more}` };
  }
  const event = parsed.data as NewEvent;
  if (event.caseId !== caseId) return { ok: false, id, reason: `The event belongs to case ${event.caseId}, not to the case it was sent to` };
  return { ok: true, event };
}

/** JSON with object keys sorted, so that two equal payloads compare equal whatever their key order. */
function canonical(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonical).join(',')}]`;
  if (value && typeof value === 'object') {
    return `{${Object.keys(value).sort().map((k) => `${JSON.stringify(k)}:${canonical((value as Record<string, unknown>)[k])}`).join(',')}}`;
  }
  return JSON.stringify(value) ?? 'null';
}

/** The content an id stands for; a repeat delivery must match it exactly. */
function fingerprint(e: NewEvent): string {
  return canonical({
    caseId: e.caseId, kind: e.kind, deviceTime: Date.parse(e.deviceTime), offsetMs: e.offsetMs,
    offsetUncertaintyMs: e.offsetUncertaintyMs, author: e.author, device: e.device, payload: e.payload,
  });
}

export function sameContent(a: NewEvent, b: NewEvent): boolean {
  return fingerprint(a) === fingerprint(b);
}

export function rowToStored(row: EventRow): StoredEvent {
  return {
    id: row.id, caseId: row.caseId, kind: row.kind, deviceTime: row.deviceTime.toISOString(),
    offsetMs: row.offsetMs, offsetUncertaintyMs: row.offsetUncertaintyMs, author: row.author, device: row.device,
    payload: row.payload, seq: row.seq, receivedAt: row.receivedAt.toISOString(),
  } as StoredEvent;
}

export function eventToRow(e: NewEvent, seq: number): NewEventRow {
  return {
    id: e.id, caseId: e.caseId, seq, kind: e.kind, deviceTime: new Date(e.deviceTime).toISOString(), offsetMs: e.offsetMs,
    offsetUncertaintyMs: e.offsetUncertaintyMs, author: e.author, device: e.device, payload: e.payload,
  };
}

/** The stored form of an accepted event: as it was inserted, with the sequence and time the server gave it. */
export function insertedToStored(row: NewEventRow, stored: { seq: number; receivedAt: Date }): StoredEvent {
  return { ...row, seq: stored.seq, receivedAt: stored.receivedAt.toISOString() } as StoredEvent;
}
