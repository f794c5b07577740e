import { MAX_BATCH_EVENTS } from '#shared/contracts/sync.ts';
import { onSignOut } from '@/lib/sign-out-hooks.ts';
import { createSyncEngine, createSyncSocket, type SyncEngine, type SyncSocket } from '@/sync/index.ts';

/**
 * The tablet's one sync engine, made the first time a recorder screen opens and kept for the life of
 * the page: it goes on sending what is queued after the screen is left. One engine per page, because two
 * would share one IndexedDB outbox and send each event twice. A sign-out closes its socket; at the next
 * sign-in (the same user or another) it connects again and records under that author.
 */
let current: SyncEngine | null = null;

export function tabletEngine(author: string): SyncEngine {
  if (!current) {
    const socket = createSyncSocket(undefined, { transports: ['websocket'] });
    followNetwork(socket);
    // Pushes as large as the protocol allows: a tablet back from an hour offline sends its queue in a
    // few round trips, not hundreds (a tap on its own is still a push of one).
    current = createSyncEngine({ socket, author, batchSize: MAX_BATCH_EVENTS });
    const engine = current;
    onSignOut(() => engine.signedOut());
  } else current.setAuthor(author);
  return current;
}

/**
 * When the browser says the network is gone, drop the socket at once rather than wait for Socket.IO's
 * heartbeat to time out (tens of seconds on a half-open connection), so the screen says "offline" as
 * soon as the tablet is; reconnect as soon as the network is back. Taps are kept on the tablet either way.
 */
function followNetwork(socket: SyncSocket): void {
  window.addEventListener('offline', () => { if (socket.connected || socket.active) socket.disconnect(); });
  window.addEventListener('online', () => { if (!socket.connected) socket.connect(); });
}
