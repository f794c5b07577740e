import type { Server as HttpServer } from 'node:http';
import type { Logger } from 'pino';
import { Server } from 'socket.io';
import type { Auth } from '../auth.ts';
import type { Config } from '../config.ts';
import type { Db } from '../db/client.ts';
import { onRecorded } from '../modules/events/recorded.ts';
import { caseRoom, MAX_PUSH_BYTES, SyncMessages, type ClientToServerEvents, type ServerToClientEvents } from '#shared/contracts/sync.ts';
import { attachPostgresAdapter } from './adapter.ts';
import { registerHandlers } from './handlers.ts';
import { requireSession, type SocketData } from './session.ts';

export interface RealtimeDeps { db: Db; auth: Auth; config: Config; logger: Logger }

export type RealtimeServer = Server<ClientToServerEvents, ServerToClientEvents, Record<string, never>, SocketData>;

export interface Realtime {
  io: RealtimeServer;
  /** Close every socket and the adapter (the HTTP server itself is closed by its owner). */
  close(): Promise<void>;
}

/** Most events in one `events.recorded` broadcast (a large push goes out in several). */
const BROADCAST_CHUNK = 100;

/**
 * The Socket.IO server of the sync protocol (shared/contracts/sync.ts) on the app's HTTP server:
 * session check at the handshake, the message handlers, rooms per case shared across nodes through
 * PostgreSQL, and the broadcast of stored events after commit (server/modules/events/recorded.ts).
 */
export async function createRealtime(httpServer: HttpServer, { db, auth, config, logger }: RealtimeDeps): Promise<Realtime> {
  const log = logger.child({ module: 'realtime' });
  const trustedOrigin = new URL(config.BETTER_AUTH_URL).origin;
  const io: RealtimeServer = new Server(httpServer, {
    serveClient: false,
    // Above the push limit, so an oversized push gets an answer; far above, the transport drops only that socket.
    maxHttpBufferSize: 2 * MAX_PUSH_BYTES,
    // A browser always sends Origin: a page of another site may not open a socket with our cookie.
    allowRequest: (req, callback) => {
      const origin = req.headers.origin;
      callback(null, !origin || origin === trustedOrigin);
    },
  });
  const adapter = await attachPostgresAdapter(io, config.DATABASE_URL, log);

  io.use(requireSession(auth));
  io.on('connection', (socket) => registerHandlers(socket, { db, auth, logger: log }));

  const stopListening = onRecorded(db, (caseId, events, origin) => {
    // The pushing socket is left out (on every node: its id is a room of its own): its ack carries the results.
    const room = origin ? io.to(caseRoom(caseId)).except(origin.socketId) : io.to(caseRoom(caseId));
    for (let i = 0; i < events.length; i += BROADCAST_CHUNK) {
      room.emit(SyncMessages.eventsRecorded, { caseId, events: events.slice(i, i + BROADCAST_CHUNK) });
    }
  });

  let closing: Promise<void> | null = null;
  return {
    io,
    close: () => (closing ??= (async () => {
      stopListening();
      io.disconnectSockets(true);
      await adapter.close();
      io.engine.close();
    })()),
  };
}
