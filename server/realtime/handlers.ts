import type { Logger } from 'pino';
import type { Socket } from 'socket.io';
import type { Auth } from '../auth.ts';
import type { Db } from '../db/client.ts';
import { clientAddress, type TrustProxy } from '../http/client-address.ts';
import { insertAudit } from '../modules/audit/queries.ts';
import { caseAccess, isDenied, recordDenial, type AccessDenied } from '../modules/events/access.ts';
import { announceRecorded } from '../modules/events/recorded.ts';
import { eventsPageWithStatus, recordEvents } from '../modules/events/service.ts';
import {
  caseJoinSchema, caseLeaveSchema, caseRoom, clockPingSchema, eventsPushSchema, MAX_PUSH_BYTES, SyncMessages,
  type CaseJoinAck, type ClockPong, type EventsPushAck, type OkAck,
} from '#shared/contracts/sync.ts';
import { handle, SyncRefusal, syncError } from './guard.ts';
import { currentUser, type SocketData } from './session.ts';

export type HandlerDeps = { db: Db; auth: Auth; logger: Logger; trustProxy: TrustProxy };

const refusal = (d: AccessDenied) => new SyncRefusal(syncError(d.code, d.message));

/** Small messages (join, leave, ping) have no reason to be larger than this. */
const SMALL_MESSAGE_BYTES = 4 * 1024;

/** The sync protocol of one socket (shared/contracts/sync.ts). */
export function registerHandlers(socket: Socket, { db, auth, logger, trustProxy }: HandlerDeps): void {
  const small = { maxBytes: SMALL_MESSAGE_BYTES, logger };

  // Join a case room, then read: an event committed in between arrives twice (the client keeps one), never zero times.
  handle(socket, SyncMessages.caseJoin, caseJoinSchema, async ({ caseId, afterSeq }): Promise<CaseJoinAck> => {
    const userId = await currentUser(auth, db, socket);
    const access = await caseAccess(db, userId, caseId);
    if (isDenied(access)) throw refusal(access);
    await socket.join(caseRoom(caseId));
    // The status as of the page's lastSeq (read with it), not the one the access check read before.
    const { status, ...page } = await eventsPageWithStatus(db, caseId, afterSeq);
    // A socket in the room hears every event from now on: its first join of a case is a reading of the
    // record, whatever it held before (a later page of the same catch-up, or a join again, is not).
    const { viewed } = socket.data as SocketData;
    if (!viewed.has(caseId)) {
      await insertAudit(db, {
        action: 'record.view', entityType: 'case', entityId: caseId, userId, unitId: access.unitId, ip: clientAddress(socket.request, trustProxy),
        detail: { via: 'sync', afterSeq, events: page.events.length },
      });
      viewed.add(caseId);
    }
    return { caseId, status: status ?? access.status, ...page };
  }, small);

  handle(socket, SyncMessages.caseLeave, caseLeaveSchema, async ({ caseId }): Promise<OkAck> => {
    await socket.leave(caseRoom(caseId));
    return { ok: true };
  }, small);

  handle(socket, SyncMessages.eventsPush, eventsPushSchema, async ({ caseId, events }): Promise<EventsPushAck> => {
    // The session check and the case access go out at once (with recordEvents' own first read); the
    // transaction begins once both passed, and a session that ended answers 'unauthorized' first.
    const confirmed = currentUser(auth, db, socket);
    const access = caseAccess(db, (socket.data as SocketData).userId, caseId).then((a) => {
      if (isDenied(a)) throw refusal(a);
      const denial = recordDenial(a);
      if (denial) throw refusal(denial);
      return a;
    });
    const { results, stored } = await recordEvents(db, { caseId, access, confirmed }, events);
    // Committed: the rest of the room hears of it; the sender has it in this ack and is left out.
    announceRecorded(db, caseId, stored, { socketId: socket.id });
    return { results };
  }, { maxBytes: MAX_PUSH_BYTES, logger });

  // RFC 5905 on-wire exchange: T2 when the ping arrived, T3 as the answer leaves.
  handle(socket, SyncMessages.clockPing, clockPingSchema, ({ t1 }, t2): ClockPong => ({ t1, t2, t3: Date.now() }), small);
}
