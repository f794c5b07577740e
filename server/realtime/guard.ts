import type { Logger } from 'pino';
import type { Socket } from 'socket.io';
import type { z } from 'zod';
import { jsonBytes, toIssues, type SyncError } from '#shared/contracts/sync.ts';

/** JSON size of a message, or null when it is nested too deeply for JSON.stringify (a RangeError). */
function measured(message: unknown): number | null {
  try {
    return jsonBytes(message);
  } catch (err) {
    if (err instanceof RangeError) return null;
    throw err;
  }
}

/** An error answer to the sender only. */
export const syncError = (code: SyncError['code'], error: string, issues?: SyncError['issues']): SyncError =>
  ({ error, code, ...(issues ? { issues } : {}) });

/** Thrown by a handler to answer with an error (not a fault of the server). */
export class SyncRefusal extends Error {
  constructor(readonly answer: SyncError) { super(answer.error); }
}

export type HandlerOptions = { maxBytes: number; logger: Logger };

/**
 * Register a message handler that cannot hurt the server or other sockets: the message must come with
 * an ack callback (one without is ignored: there is no one to answer), fit in `maxBytes` of JSON and
 * pass its zod schema; otherwise the sender alone gets an error answer naming the field. Anything the
 * handler throws is answered as an error too (a SyncRefusal as itself, the rest as 'internal', logged).
 * `receivedAt` is the server clock when the message arrived, before any work (RFC 5905 T2).
 */
export function handle<S extends z.ZodType>(
  socket: Socket,
  name: string,
  schema: S,
  run: (msg: z.output<S>, receivedAt: number) => Promise<unknown> | unknown,
  { maxBytes, logger }: HandlerOptions,
): void {
  socket.on(name, async (...args: unknown[]) => {
    const receivedAt = Date.now();
    const ack = args.at(-1);
    if (typeof ack !== 'function') return;
    const reply = (answer: unknown) => { try { ack(answer); } catch { /* the socket went away meanwhile */ } };
    try {
      const message = args.slice(0, -1);
      if (message.length !== 1) { reply(syncError('bad_request', `${name} takes one message object and an ack`)); return; }
      const bytes = measured(message[0]);
      if (bytes === null) { reply(syncError('bad_request', `The ${name} message is nested too deeply to read`)); return; }
      if (bytes > maxBytes) { reply(syncError('too_large', `The ${name} message is ${bytes} bytes; at most ${maxBytes} are accepted`)); return; }
      const parsed = schema.safeParse(message[0]);
      if (!parsed.success) {
        const issues = toIssues(parsed.error);
        const first = issues[0];
        reply(syncError('bad_request', `Invalid ${name}: ${first?.path || '(root)'}: ${first?.message ?? 'invalid'}`, issues));
        return;
      }
      reply(await run(parsed.data, receivedAt));
    } catch (err) {
      if (err instanceof SyncRefusal) { reply(err.answer); return; }
      logger.error({ err, message: name, socket: socket.id }, 'socket message failed');
      reply(syncError('internal', 'Something went wrong on the server; it has been logged'));
    }
  });
}
