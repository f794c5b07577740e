import { io, type ManagerOptions, type Socket, type SocketOptions } from 'socket.io-client';
import type { z } from 'zod';
import type { ClientToServerEvents, ServerToClientEvents } from '#shared/contracts/sync.ts';

/** The one socket a tablet holds to the server, typed by the sync contract. */
export type SyncSocket = Socket<ServerToClientEvents, ClientToServerEvents>;

export type SyncSocketOptions = Partial<ManagerOptions & SocketOptions>;

/**
 * A socket to the sync server, not yet connected (the engine connects it). In the browser the session
 * cookie goes along by itself (same origin, `withCredentials`); Node callers pass it in `extraHeaders`.
 * Socket.IO reconnects by itself with its back-off; the engine resends what it holds on each connect.
 */
export function createSyncSocket(url?: string, options: SyncSocketOptions = {}): SyncSocket {
  const opts: SyncSocketOptions = { autoConnect: false, withCredentials: true, reconnectionDelayMax: 10_000, ...options };
  return url ? io(url, opts) : io(opts);
}

/** Why a request over the socket got no usable answer. */
export class NoAnswerError extends Error {
  override name = 'NoAnswerError';
}

/**
 * Emit one message and wait for its ack at most `timeoutMs`; the ack is parsed with `schema`, so what
 * the caller receives is checked. Rejects with NoAnswerError on a timeout, a disconnect or a malformed answer.
 */
export async function request<S extends z.ZodType>(
  socket: SyncSocket,
  name: keyof ClientToServerEvents,
  message: unknown,
  schema: S,
  timeoutMs: number,
): Promise<z.infer<S>> {
  let answer: unknown;
  try {
    // The typed map checks each message at its call site in the engine; here the name is generic.
    answer = await (socket.timeout(timeoutMs) as unknown as { emitWithAck(n: string, m: unknown): Promise<unknown> }).emitWithAck(name, message);
  } catch (err) {
    throw new NoAnswerError(`No answer to ${name}: ${(err as Error).message}`);
  }
  const parsed = schema.safeParse(answer);
  if (!parsed.success) throw new NoAnswerError(`Malformed answer to ${name}: ${parsed.error.issues[0]?.message ?? 'invalid'}`);
  return parsed.data;
}
