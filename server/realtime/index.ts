import type { Server as HttpServer } from 'node:http';
import type { Logger } from 'pino';
import { Server } from 'socket.io';
import { z } from 'zod';
import type { Auth } from '../auth.ts';
import type { Config } from '../config.ts';
import type { Db } from '../db/client.ts';
import { compileTrustProxy } from '../http/client-address.ts';
import { rowToStored } from '../modules/events/intake.ts';
import { eventsBetween } from '../modules/events/queries.ts';
import { onRecorded } from '../modules/events/recorded.ts';
import { caseRoom, MAX_PUSH_BYTES, SyncMessages, type ClientToServerEvents, type ServerToClientEvents } from '#shared/contracts/sync.ts';
import { uuidSchema } from '#shared/schemas/common.ts';
import type { StoredEvent } from '#shared/schemas/events.ts';
import { attachPostgresAdapter } from './adapter.ts';
import { registerHandlers } from './handlers.ts';
import { startRightsCheck } from './rights.ts';
import { requireSession, type SocketData } from './session.ts';

export interface RealtimeDeps { db: Db; auth: Auth; config: Config; logger: Logger }

/**
 * Between server nodes (through the adapter): "these sequences of this case were stored". Only the
 * range travels (one small NOTIFY); a node with tablets in the case's room reads the rows, committed
 * before the message left, and tells its own sockets.
 */
const RECORDED_ELSEWHERE = 'events.recorded.elsewhere';
const recordedElsewhereSchema = z.object({ caseId: uuidSchema, fromSeq: z.int().positive(), toSeq: z.int().positive() });
type RecordedElsewhere = z.infer<typeof recordedElsewhereSchema>;
type InterServerEvents = { [RECORDED_ELSEWHERE]: (msg: RecordedElsewhere) => void };

export type RealtimeServer = Server<ClientToServerEvents, ServerToClientEvents, InterServerEvents, SocketData>;

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
  const trustProxy = compileTrustProxy(config.TRUST_PROXY);
  io.on('connection', (socket) => registerHandlers(socket, { db, auth, logger: log, trustProxy }));
  const stopRightsCheck = startRightsCheck(() => [...io.of('/').sockets.values()], db, config.RIGHTS_CHECK_MS, log);

  // A plain io.to(room).emit() with the adapter waits for its NOTIFY to PostgreSQL before it writes to
  // this node's own sockets, and sends every event through PostgreSQL (a table row above 8,000 bytes),
  // which each node, this one too, reads back and decodes. So the tablets on this node are told first,
  // synchronously, and the other nodes get only the range of sequences (serverSideEmit reaches every
  // node but this one).
  const tellLocal = (caseId: string, events: StoredEvent[], except?: string) => {
    // The adapter encodes a packet before it looks for sockets: with no one else in the room, none is made.
    const here = io.of('/').adapter.rooms.get(caseRoom(caseId));
    if (!here || here.size === 0 || (here.size === 1 && except && here.has(except))) return;
    const room = except ? io.local.to(caseRoom(caseId)).except(except) : io.local.to(caseRoom(caseId));
    for (let i = 0; i < events.length; i += BROADCAST_CHUNK) {
      room.emit(SyncMessages.eventsRecorded, { caseId, events: events.slice(i, i + BROADCAST_CHUNK) });
    }
  };
  // The pushing socket is left out: its ack carries the results (and it is on this node).
  const stopListening = onRecorded(db, (caseId, events, origin) => {
    tellLocal(caseId, events, origin?.socketId);
    io.serverSideEmit(RECORDED_ELSEWHERE, { caseId, fromSeq: events[0]!.seq, toSeq: events.at(-1)!.seq });
  });
  io.on(RECORDED_ELSEWHERE, (msg: unknown) => {
    const parsed = recordedElsewhereSchema.safeParse(msg);
    if (!parsed.success) { log.warn({ msg }, 'malformed message from another node'); return; }
    const { caseId, fromSeq, toSeq } = parsed.data;
    if (!io.of('/').adapter.rooms.get(caseRoom(caseId))?.size) return; // no tablet of this case here: nothing to read
    eventsBetween(db, caseId, fromSeq, toSeq).then(
      (rows) => tellLocal(caseId, rows.map(rowToStored)),
      (err: unknown) => log.warn({ err, caseId }, 'events stored on another node could not be read'), // the tablets fill the gap at their next event or join
    );
  });

  let closing: Promise<void> | null = null;
  return {
    io,
    close: () => (closing ??= (async () => {
      stopListening();
      stopRightsCheck();
      // The connections are closed, the sockets not told to disconnect: a tablet the server told so does
      // not reconnect by itself, and one whose connection dropped does (to this server started again, or
      // to another node).
      io.engine.close();
      await adapter.close();
    })()),
  };
}
