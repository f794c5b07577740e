import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import pino, { type Logger } from 'pino';
import { createApp } from './app.ts';
import { createAuth } from './auth.ts';
import type { Config } from './config.ts';
import { createDatabase } from './db/client.ts';
import { createRealtime, type RealtimeServer } from './realtime/index.ts';
import { createMailer } from './services/mail.ts';

export interface RunningServer {
  /** http://host:port the server listens on (port 0 in the config picks a free one). */
  url: string;
  httpServer: Server;
  /** The Socket.IO server (its rooms are this node's view of who hears which case). */
  io: RealtimeServer;
  /** Stop accepting, close sockets and connections, end the pool. */
  close(): Promise<void>;
}

/** HTTP + Socket.IO on one port, with the database, auth and mail wired from the config. */
export async function startServer(config: Config, options: { logger?: Logger } = {}): Promise<RunningServer> {
  const logger = options.logger ?? pino({ level: config.LOG_LEVEL });
  const database = createDatabase(config.DATABASE_URL);
  const mailer = createMailer(config);
  const auth = createAuth({ db: database.db, config, mailer, logger });
  const app = createApp({ config, db: database.db, auth, logger });
  const httpServer = createServer(app);
  const realtime = await createRealtime(httpServer, { db: database.db, auth, config, logger });

  await new Promise<void>((resolve, reject) => {
    httpServer.once('error', reject);
    httpServer.listen(config.PORT, config.HOST, () => { httpServer.off('error', reject); resolve(); });
  });
  const { port } = httpServer.address() as AddressInfo;
  const host = config.HOST.includes(':') ? `[${config.HOST}]` : config.HOST;

  let closing: Promise<void> | null = null;
  const close = () => (closing ??= (async () => {
    await realtime.close();
    await new Promise<void>((resolve) => {
      httpServer.close(() => resolve());
      // Keep-alive connections would hold close() open until they time out.
      httpServer.closeIdleConnections();
      setTimeout(() => httpServer.closeAllConnections(), 5_000).unref();
    });
    await database.close();
  })());

  return { url: `http://${host}:${port}`, httpServer, io: realtime.io, close };
}
