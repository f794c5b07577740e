import { createAdapter } from '@socket.io/postgres-adapter';
import type { Logger } from 'pino';
import pg from 'pg';
import type { Server } from 'socket.io';

/**
 * Rooms shared between server nodes through PostgreSQL (@socket.io/postgres-adapter): a broadcast on
 * one node goes out as NOTIFY and is delivered by every node to its own sockets; packets over 8,000
 * bytes travel through the socket_io_attachments table (drizzle/0002_socket_io_attachments.sql).
 * The adapter holds one connection in LISTEN for good, so it gets its own small pool.
 */
export async function attachPostgresAdapter(io: Server, databaseUrl: string, logger: Logger, waitMs = 5_000) {
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 4 });
  pool.on('error', (err) => logger.warn({ err }, 'socket adapter pool: idle client error'));
  let closing = false;
  io.adapter(createAdapter(pool, {
    errorHandler: (err) => { if (!closing) logger.warn({ err }, 'socket adapter error'); },
  }));
  await listening(io, waitMs, logger);
  return {
    pool,
    async close(): Promise<void> {
      closing = true;
      await io.of('/').adapter.close();
      await pool.end();
    },
  };
}

/**
 * Wait until the adapter's LISTEN connection is up, so that a broadcast from another node right after
 * start is not missed. The adapter has no public signal for this; its pub/sub client sets `client` once
 * LISTEN has run (@socket.io/postgres-adapter 0.5, dist/util.js). Bounded: after `waitMs` it goes on.
 */
async function listening(io: Server, waitMs: number, logger: Logger): Promise<void> {
  const pubsub = (io.of('/').adapter as unknown as { client?: { client?: unknown } }).client;
  const until = Date.now() + waitMs;
  while (pubsub && !pubsub.client) {
    if (Date.now() > until) { logger.warn('socket adapter: LISTEN not confirmed; going on'); return; }
    await new Promise((r) => setTimeout(r, 20));
  }
}
