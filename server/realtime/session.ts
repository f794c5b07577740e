import { fromNodeHeaders } from 'better-auth/node';
import type { Socket } from 'socket.io';
import type { Auth } from '../auth.ts';
import { SyncRefusal, syncError } from './guard.ts';

/** What a socket carries once its handshake passed (socket.data). */
export type SocketData = { userId: string };

/** The signed-in user of a handshake's cookie, or null. */
export async function sessionUserId(auth: Auth, socket: Pick<Socket, 'handshake'>): Promise<string | null> {
  const session = await auth.api.getSession({ headers: fromNodeHeaders(socket.handshake.headers) });
  return session?.user.id ?? null;
}

/**
 * Connection middleware: a socket opens only with a valid better-auth session cookie. The refusal
 * reaches the client as `connect_error` with `data.code`.
 */
export function requireSession(auth: Auth) {
  return (socket: Socket, next: (err?: Error) => void) => {
    sessionUserId(auth, socket).then(
      (userId) => {
        if (!userId) return next(Object.assign(new Error('Sign in first'), { data: { code: 'unauthorized' } }));
        (socket.data as SocketData).userId = userId;
        next();
      },
      () => next(Object.assign(new Error('The session could not be checked; try again'), { data: { code: 'internal' } })),
    );
  };
}

/**
 * The session checked again for a join or a push (it may have expired or been revoked since the
 * handshake, say after a password reset). The cookie is the handshake's: a socket keeps its user.
 */
export async function currentUser(auth: Auth, socket: Socket): Promise<string> {
  const userId = await sessionUserId(auth, socket);
  if (!userId || userId !== (socket.data as SocketData).userId) {
    throw new SyncRefusal(syncError('unauthorized', 'Your session has ended; sign in again'));
  }
  return userId;
}
