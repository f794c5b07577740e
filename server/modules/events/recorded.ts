import type { StoredEvent } from '#shared/schemas/events.ts';

/**
 * After a push has committed, its stored events are announced here, and from here only: the socket
 * server (server/realtime) listens and broadcasts `events.recorded` to the case's room. The REST route
 * and the socket handler both call `announceRecorded` after `recordEvents` resolved, never inside the
 * transaction. Listeners are kept per database handle, which is per server node: two nodes in one
 * process (the tests) do not hear each other here, only through the Socket.IO Postgres adapter.
 */
export type RecordedListener = (caseId: string, events: StoredEvent[], origin?: RecordedOrigin) => void;

/** Who pushed: a socket already has the results in its ack, so the broadcast leaves it out. */
export type RecordedOrigin = { socketId: string };

const listeners = new WeakMap<object, Set<RecordedListener>>();

export function onRecorded(db: object, listener: RecordedListener): () => void {
  let set = listeners.get(db);
  if (!set) { set = new Set(); listeners.set(db, set); }
  set.add(listener);
  return () => { set.delete(listener); };
}

export function announceRecorded(db: object, caseId: string, events: StoredEvent[], origin?: RecordedOrigin): void {
  if (!events.length) return;
  for (const l of listeners.get(db) ?? []) l(caseId, events, origin);
}
