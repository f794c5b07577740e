import { createServer, type Server as HttpServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { Server } from 'socket.io';
import {
  caseJoinSchema, caseRoom, eventsPushSchema, SyncMessages, type ClientToServerEvents, type PushResult, type ServerToClientEvents,
} from '#shared/contracts/sync.ts';
import { newEventSchema, type NewEvent, type StoredEvent } from '#shared/schemas/events.ts';

/**
 * A small sync server for the client tests: it speaks the real protocol of shared/contracts/sync.ts over
 * a real Socket.IO server on loopback, and keeps each case's log in memory. The server of record (with
 * PostgreSQL, sessions and roles) is tested in tests/integration; here the client is under test, so the
 * server's answers can be steered: refuse some events, swallow acks, shift its clock.
 */
export type TestServerOptions = {
  /** A reason to refuse this event, or null to store it. */
  refuse?: (e: NewEvent) => string | null;
  /** How many of the next pushes are stored but never answered (a lost ack). */
  dropAcks?: number;
  /** The server clock minus the real clock, ms. */
  clockShiftMs?: number;
};

export async function startTestSyncServer(options: TestServerOptions = {}) {
  const http: HttpServer = createServer();
  const io = new Server<ClientToServerEvents, ServerToClientEvents>(http);
  const logs = new Map<string, StoredEvent[]>();
  const pushes: string[][] = [];
  const state = { ...options, dropAcks: options.dropAcks ?? 0 };
  const serverNow = () => Date.now() + (state.clockShiftMs ?? 0);

  function store(caseId: string, raw: unknown[]): { results: PushResult[]; added: StoredEvent[] } {
    const log = logs.get(caseId) ?? [];
    logs.set(caseId, log);
    const added: StoredEvent[] = [];
    const results = raw.map((item): PushResult => {
      const p = newEventSchema.safeParse(item);
      if (!p.success) return { id: null, status: 'refused', reason: p.error.issues[0]?.message ?? 'invalid' };
      const e = p.data as NewEvent;
      const known = log.find((s) => s.id === e.id);
      if (known) return { id: e.id, status: 'duplicate', seq: known.seq, receivedAt: known.receivedAt };
      const reason = state.refuse?.(e) ?? null;
      if (reason) return { id: e.id, status: 'refused', reason };
      const s = { ...e, seq: log.length + 1, receivedAt: new Date().toISOString() } as StoredEvent;
      log.push(s);
      added.push(s);
      return { id: e.id, status: 'accepted', seq: s.seq, receivedAt: s.receivedAt };
    });
    return { results, added };
  }

  io.on('connection', (socket) => {
    socket.on(SyncMessages.eventsPush, (msg, ack) => {
      const m = eventsPushSchema.parse(msg);
      pushes.push(m.events.map((e) => (e as NewEvent).id));
      const { results, added } = store(m.caseId, m.events);
      // As the real server: the rest of the room hears of it, the sender has its ack.
      if (added.length) socket.to(caseRoom(m.caseId)).emit(SyncMessages.eventsRecorded, { caseId: m.caseId, events: added });
      if (state.dropAcks > 0) { state.dropAcks--; return; }
      ack({ results });
    });
    socket.on(SyncMessages.caseJoin, async (msg, ack) => {
      const m = caseJoinSchema.parse(msg);
      await socket.join(caseRoom(m.caseId));
      const log = logs.get(m.caseId) ?? [];
      ack({ caseId: m.caseId, status: log.length ? 'recording' : 'scheduled', events: log.filter((e) => e.seq > m.afterSeq), lastSeq: log.length, hasMore: false });
    });
    socket.on(SyncMessages.caseLeave, async (msg, ack) => { await socket.leave(caseRoom(msg.caseId)); ack({ ok: true }); });
    socket.on(SyncMessages.clockPing, (msg, ack) => {
      const t2 = serverNow();
      ack({ t1: msg.t1, t2, t3: serverNow() });
    });
  });

  await new Promise<void>((resolve) => http.listen(0, '127.0.0.1', resolve));
  const url = `http://127.0.0.1:${(http.address() as AddressInfo).port}`;
  return {
    url,
    io,
    state,
    /** Every push received, as the list of ids it carried. */
    pushes,
    log: (caseId: string) => logs.get(caseId) ?? [],
    /** Store events as if another tablet had pushed them (no socket of ours involved). */
    storeFromElsewhere: (caseId: string, events: NewEvent[]) => {
      const { added } = store(caseId, events);
      if (added.length) io.to(caseRoom(caseId)).emit(SyncMessages.eventsRecorded, { caseId, events: added });
      return added;
    },
    close: () => new Promise<void>((resolve) => { io.close(() => resolve()); }),
  };
}
export type TestSyncServer = Awaited<ReturnType<typeof startTestSyncServer>>;
