import { z } from 'zod';
import { apiErrorSchema, uuidSchema } from '../schemas/common.ts';
import { caseStatusSchema } from '../schemas/cases.ts';
import { MAX_EVENT_BYTES, storedEventSchema, type NewEvent, type StoredEvent } from '../schemas/events.ts';

/**
 * The real-time sync protocol between a tablet and the server (Socket.IO), one zod schema per message.
 * The server validates every incoming message with these; the client validates every answer.
 *
 * Delivery is at-least-once (the tablet resends until it holds an answer); the server stores each event
 * id once, so the effect is exactly once. Errors are answered to the sender only, through the ack.
 */
export const SyncMessages = {
  /** client → server, with ack: push a batch of events of one case. */
  eventsPush: 'events.push',
  /** client → server, with ack: enter the case room and read what was stored after a sequence. */
  caseJoin: 'case.join',
  /** client → server, with ack: leave the case room. */
  caseLeave: 'case.leave',
  /** client → server, with ack: one NTP-style clock sample (RFC 5905 on-wire exchange). */
  clockPing: 'clock.ping',
  /** server → client: events stored in a case, sent to its room after the transaction committed. */
  eventsRecorded: 'events.recorded',
} as const;

/** Most events in one push (the client batches below it). */
export const MAX_BATCH_EVENTS = 500;
/** Largest JSON size of one push message, bytes; the socket server's transport limit sits above it. */
export const MAX_PUSH_BYTES = 1024 * 1024;
/** Most events in one page of a join answer or a REST read. */
export const EVENTS_PAGE_SIZE = 500;
const CASE_ROOM = 'case:';
/** Room of one case: every socket that joined it receives its `events.recorded`. */
export const caseRoom = (caseId: string) => `${CASE_ROOM}${caseId.toLowerCase()}`;
/** The case whose room this is, or null for any other room (a socket's own). */
export const caseOfRoom = (room: string) => (room.startsWith(CASE_ROOM) ? room.slice(CASE_ROOM.length) : null);
/** The highest sequence a case can reach (the column is a PostgreSQL integer); a read after it is refused. */
export const MAX_SEQ = 2_147_483_647;

export { MAX_EVENT_BYTES };

/** The stored-event schema typed as the StoredEvent union (zod infers a wider type from the variant list). */
const storedEvent = storedEventSchema as unknown as z.ZodType<StoredEvent>;

/** Why a whole message was answered with an error (not one event of it). */
export const syncErrorCodes = ['bad_request', 'too_large', 'unauthorized', 'forbidden', 'not_found', 'internal'] as const;
export type SyncErrorCode = (typeof syncErrorCodes)[number];

/** The error answer: `{ error, issues }` like the REST API, plus a code the client acts on. */
export const syncErrorSchema = apiErrorSchema.extend({ code: z.enum(syncErrorCodes) });
export type SyncError = z.infer<typeof syncErrorSchema>;

// ——— events.push ———

/**
 * The events are checked one by one (an invalid event is refused alone with its reason), so the
 * message schema only bounds the array; each item is parsed with `newEventSchema` by the server.
 */
export const eventsPushSchema = z.strictObject({
  caseId: uuidSchema,
  events: z.array(z.unknown()).min(1, 'At least one event').max(MAX_BATCH_EVENTS, `At most ${MAX_BATCH_EVENTS} events in one push`),
});
export type EventsPush = { caseId: string; events: NewEvent[] };

/** The answer for one event of a push, in the order they were sent. */
export const pushResultSchema = z.discriminatedUnion('status', [
  /** Stored now with this per-case sequence number. */
  z.strictObject({ id: z.string(), status: z.literal('accepted'), seq: z.number().int().positive(), receivedAt: z.string() }),
  /** Already stored earlier with the same content (a repeat delivery): the sequence it was given then. */
  z.strictObject({ id: z.string(), status: z.literal('duplicate'), seq: z.number().int().positive(), receivedAt: z.string() }),
  /** Not stored; the reason in words. `id` is null when the item had no readable id. */
  z.strictObject({ id: z.string().nullable(), status: z.literal('refused'), reason: z.string() }),
]);
export type PushResult = z.infer<typeof pushResultSchema>;

export const eventsPushAckSchema = z.union([z.strictObject({ results: z.array(pushResultSchema) }), syncErrorSchema]);
export type EventsPushAck = z.infer<typeof eventsPushAckSchema>;

// ——— case.join / case.leave ———

export const caseJoinSchema = z.strictObject({
  caseId: uuidSchema,
  /** The last sequence the tablet already holds for this case; 0 for none. */
  afterSeq: z.number().int().min(0).max(MAX_SEQ),
});
export type CaseJoin = z.infer<typeof caseJoinSchema>;

/** One page of stored events after `afterSeq`; ask again from the last one while `hasMore`. */
export const eventsPageSchema = z.strictObject({
  events: z.array(storedEvent),
  /** The case's highest sequence now. */
  lastSeq: z.number().int().min(0),
  hasMore: z.boolean(),
});
export type EventsPage = { events: StoredEvent[]; lastSeq: number; hasMore: boolean };

export const caseJoinAckSchema = z.union([
  eventsPageSchema.extend({ caseId: uuidSchema, status: caseStatusSchema }),
  syncErrorSchema,
]);
export type CaseJoinAck = (EventsPage & { caseId: string; status: z.infer<typeof caseStatusSchema> }) | SyncError;

export const caseLeaveSchema = z.strictObject({ caseId: uuidSchema });
export const okAckSchema = z.union([z.strictObject({ ok: z.literal(true) }), syncErrorSchema]);
export type OkAck = z.infer<typeof okAckSchema>;

// ——— clock.ping ———

/** t1: the tablet's clock when it sent the ping, ms since the epoch (RFC 5905 T1, origin timestamp). */
export const clockPingSchema = z.strictObject({ t1: z.number().finite() });
/** t2: server clock at receipt (T2), t3: server clock at reply (T3); t1 echoed so a late answer is matched. */
export const clockPongSchema = z.strictObject({ t1: z.number().finite(), t2: z.number().finite(), t3: z.number().finite() });
export const clockPingAckSchema = z.union([clockPongSchema, syncErrorSchema]);
export type ClockPong = z.infer<typeof clockPongSchema>;

// ——— events.recorded ———

export const eventsRecordedSchema = z.strictObject({
  caseId: uuidSchema,
  events: z.array(storedEvent).min(1),
});
export type EventsRecorded = { caseId: string; events: StoredEvent[] };

/** Typed Socket.IO maps, used by `new Server<...>()` and `io<...>()`. */
export interface ClientToServerEvents {
  'events.push': (msg: EventsPush, ack: (a: EventsPushAck) => void) => void;
  'case.join': (msg: CaseJoin, ack: (a: CaseJoinAck) => void) => void;
  'case.leave': (msg: { caseId: string }, ack: (a: OkAck) => void) => void;
  'clock.ping': (msg: { t1: number }, ack: (a: ClockPong | SyncError) => void) => void;
}
export interface ServerToClientEvents {
  'events.recorded': (msg: EventsRecorded) => void;
}

/** True when an ack is an error answer. */
export function isSyncError(a: unknown): a is SyncError {
  return syncErrorSchema.safeParse(a).success;
}

/** A zod error as `issues` of an error answer: the field path in dots, and the message. */
export function toIssues(error: z.ZodError): { path: string; message: string }[] {
  return error.issues.map((i) => ({ path: i.path.map(String).join('.'), message: i.message }));
}

/** Byte length of a value as JSON in UTF-8 (what the size limits count). */
export function jsonBytes(value: unknown): number {
  return new TextEncoder().encode(JSON.stringify(value) ?? '').length;
}
