import pino from 'pino';
import { loadConfig } from './config.ts';
import { startServer } from './server.ts';

// `node --import tsx server/index.ts`: listen from the environment (server/config.ts), stop cleanly on
// SIGINT/SIGTERM (in-flight requests finish, sockets close, the pool ends), forced after 10 s.
const config = loadConfig();
const logger = pino({ level: config.LOG_LEVEL });
const server = await startServer(config, { logger });
logger.info({ url: server.url }, 'Ledgerline server listening');

let stopping = false;
const stop = (signal: NodeJS.Signals) => {
  if (stopping) return;
  stopping = true;
  logger.info({ signal }, 'stopping');
  setTimeout(() => { logger.error('shutdown took too long; exiting'); process.exit(1); }, 10_000).unref();
  server.close().then(() => process.exit(0), (err: unknown) => { logger.error({ err }, 'shutdown failed'); process.exit(1); });
};
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
process.on('unhandledRejection', (err) => logger.error({ err }, 'unhandled rejection'));
