import { fromNodeHeaders } from 'better-auth/node';
import { eq } from 'drizzle-orm';
import type { Socket } from 'socket.io';
import type { Auth } from '../auth.ts';
import type { Db } from '../db/client.ts';
import { session } from '../db/schema/index.ts';
import { SyncRefusal, syncError } from './guard.ts';

/**
 * What a socket carries once its handshake passed (socket.data): its user, the token of the session its
 * cookie names, when better-auth last checked that session in full, and the cases whose reading by this
 * socket is in the audit log.
 */
export type SocketData = { userId: string; sessionToken: string; fullCheckAt: number; viewed: Set<string> };

/**
 * How long the session of a socket is checked by its row alone between two full checks. A full check
 * (better-auth's getSession: the cookie's signature, the session, the user, and the sliding expiry it
 * keeps up) costs some milliseconds of CPU on every push; the row check, one indexed read, sees
 * everything that ends a session: sign-out and revocation delete the row, expiry is its expiresAt.
 */
const FULL_CHECK_MS = 5 * 60_000;

/** The signed-in user of a handshake's cookie and the session's token, or null. */
export async function handshakeSession(auth: Auth, socket: Pick<Socket, 'handshake'>): Promise<{ userId: string; token: string } | null> {
  const found = await auth.api.getSession({ headers: fromNodeHeaders(socket.handshake.headers) });
  return found ? { userId: found.user.id, token: found.session.token } : null;
}

/**
 * Connection middleware: a socket opens only with a valid better-auth session cookie. The refusal
 * reaches the client as `connect_error` with `data.code`.
 */
export function requireSession(auth: Auth) {
  return (socket: Socket, next: (err?: Error) => void) => {
    handshakeSession(auth, socket).then(
      (found) => {
        if (!found) return next(Object.assign(new Error('Sign in first'), { data: { code: 'unauthorized' } }));
        const data: SocketData = { userId: found.userId, sessionToken: found.token, fullCheckAt: Date.now(), viewed: new Set() };
        Object.assign(socket.data as SocketData, data);
        next();
      },
      () => next(Object.assign(new Error('The session could not be checked; try again'), { data: { code: 'internal' } })),
    );
  };
}

/** The session row of a token, if it is still there and not expired, is this user's. */
async function sessionRowHolds(db: Db, token: string, userId: string): Promise<boolean> {
  const [row] = await db.select({ userId: session.userId, expiresAt: session.expiresAt }).from(session)
    .where(eq(session.token, token)).limit(1);
  return !!row && row.userId === userId && row.expiresAt.getTime() > Date.now();
}

/**
 * The session checked again for a join or a push (it may have expired or been revoked since the
 * handshake, say after a password reset): by its row, and in full by better-auth every FULL_CHECK_MS.
 * The cookie is the handshake's: a socket keeps its user.
 */
export async function currentUser(auth: Auth, db: Db, socket: Socket): Promise<string> {
  const data = socket.data as SocketData;
  let holds: boolean;
  if (Date.now() - data.fullCheckAt >= FULL_CHECK_MS) {
    const found = await handshakeSession(auth, socket);
    holds = found?.userId === data.userId;
    if (found && holds) Object.assign(data, { sessionToken: found.token, fullCheckAt: Date.now() });
  } else {
    holds = await sessionRowHolds(db, data.sessionToken, data.userId);
  }
  if (!holds) throw new SyncRefusal(syncError('unauthorized', 'Your session has ended; sign in again'));
  return data.userId;
}
