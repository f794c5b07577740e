import { and, eq, inArray } from 'drizzle-orm';
import type { Logger } from 'pino';
import type { Socket } from 'socket.io';
import type { Db } from '../db/client.ts';
import { cases, member, session } from '../db/schema/index.ts';
import { caseOfRoom, caseRoom } from '#shared/contracts/sync.ts';
import { roles } from '#shared/schemas/common.ts';
import type { SocketData } from './session.ts';

/** The case ids of the rooms a socket is in. */
const casesOf = (socket: Socket) => [...socket.rooms].flatMap((r) => caseOfRoom(r) ?? []);

/**
 * What a socket hears without asking, checked again for every socket of this node. A push or a join
 * checks the session and the case itself; a socket that only listens to a case's room would go on
 * hearing it after its session ended (signed out on another page, revoked, expired) or after its user
 * left the case's unit. So: a socket whose session row is gone or expired is closed (the tablet keeps
 * its queue, and connects again at the next sign-in); a room whose case the user may no longer read is
 * left. Two reads for all the sockets of the node, whatever their number.
 */
export async function checkRights(sockets: readonly Socket[], db: Db): Promise<{ closed: number; left: number }> {
  if (!sockets.length) return { closed: 0, left: 0 };
  const tokens = [...new Set(sockets.map((s) => (s.data as SocketData).sessionToken))];
  const rows = await db.select({ token: session.token, userId: session.userId, expiresAt: session.expiresAt })
    .from(session).where(inArray(session.token, tokens));
  const now = Date.now();
  const holding = new Map(rows.filter((r) => r.expiresAt.getTime() > now).map((r) => [r.token, r.userId]));
  let closed = 0;
  const open: Socket[] = [];
  for (const s of sockets) {
    const data = s.data as SocketData;
    if (holding.get(data.sessionToken) === data.userId) { open.push(s); continue; }
    s.disconnect(true);
    closed++;
  }

  // The rooms as they are before the read: a room joined while it runs passed its own access check then.
  const heard = new Map(open.map((s) => [s, casesOf(s)]));
  const caseIds = [...new Set([...heard.values()].flat())];
  if (!caseIds.length) return { closed, left: 0 };
  const userIds = [...new Set(open.map((s) => (s.data as SocketData).userId))];
  // Every member of a case's unit with one of the roles may read its record (caseAccess in access.ts).
  const readable = await db.select({ caseId: cases.id, userId: member.userId }).from(cases)
    .innerJoin(member, eq(member.organizationId, cases.unitId))
    .where(and(inArray(cases.id, caseIds), inArray(member.userId, userIds), inArray(member.role, [...roles])));
  const may = new Set(readable.map((r) => `${r.userId} ${r.caseId}`));
  let left = 0;
  for (const [s, rooms] of heard) {
    const { userId } = s.data as SocketData;
    for (const caseId of rooms) {
      if (may.has(`${userId} ${caseId}`)) continue;
      await s.leave(caseRoom(caseId));
      left++;
    }
  }
  return { closed, left };
}

/** Run `checkRights` over this node's sockets every `everyMs`, one run at a time; returns the stop. */
export function startRightsCheck(sockets: () => readonly Socket[], db: Db, everyMs: number, log: Logger): () => void {
  let running = false;
  const timer = setInterval(() => {
    if (running) return;
    running = true;
    checkRights(sockets(), db).then(
      ({ closed, left }) => { if (closed || left) log.info({ closed, left }, 'sockets whose rights ended were closed or left rooms'); },
      (err: unknown) => log.warn({ err }, 'the rights of open sockets could not be checked; trying again at the next round'),
    ).finally(() => { running = false; });
  }, everyMs);
  timer.unref();
  return () => clearInterval(timer);
}
