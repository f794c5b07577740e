// `npm start`: set up what is missing (packages, PostgreSQL, secret, schema, demo data, fakes, client
// build), then run the server until Ctrl-C. `npm run dev` (--dev): the same set-up, then Vite's dev
// server on 5173 (proxying /api and /socket.io to the server) and the server in watch mode.
// A second run skips what is already done: no reinstall, no reseed, no rebuild.
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { ensurePackages } from './lib/install.mjs';
import { dataDirs, devDatabase, devPorts, S3_BUCKET, serverEnv } from './lib/ports.mjs';
import { anyServiceExit, assertPortFree, isStopping, onCleanup, startService, stopAll, stopOnSignals } from './lib/proc.mjs';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const dev = process.argv.includes('--dev');
const dirs = dataDirs(root);
const ports = devPorts;
const log = (line) => console.log(line);
const started = Date.now();

stopOnSignals(log);

async function main() {
  ensurePackages({ root, stampFile: dirs.installStamp, log });
  // Imported only now: these modules need the packages installed above.
  const { ensurePostgres } = await import('./lib/postgres.mjs');
  const setup = await import('./lib/setup.mjs');
  setup.requireFiles(root, [setup.SERVER, setup.MIGRATE, setup.SEED]);

  const listeners = [[ports.app, 'server'], [ports.smtp, 'SMTP fake'], [ports.mailWeb, 'mail page'], [ports.s3, 'S3 fake']];
  if (dev) listeners.push([ports.vite, 'Vite dev server']);
  for (const [port, what] of listeners) await assertPortFree(port, what);

  const pg = await ensurePostgres({ dataDir: dirs.pg, port: ports.pg, database: devDatabase, durable: true, log });
  if (pg.startedHere) onCleanup(() => { log('Stopping PostgreSQL…'); pg.stop(); });

  const secret = setup.ensureSecret(dirs.authSecret);
  const origin = dev ? `http://localhost:${ports.vite}` : `http://localhost:${ports.app}`;
  const env = { ...process.env, ...serverEnv({ ports, database: devDatabase, secret, origin }) };
  await setup.migrate(root, env);
  await setup.seed(root, env);
  await setup.startFakes({ root, ports, mailDir: dirs.mail, s3Dir: dirs.s3, bucket: S3_BUCKET });
  if (!dev) await setup.buildClient({ root, stampFile: dirs.buildStamp, log });

  await startService({
    name: 'server', cmd: process.execPath, cwd: root, env,
    args: ['--import', 'tsx', ...(dev ? ['--watch'] : []), setup.SERVER],
    readyUrl: `http://127.0.0.1:${ports.app}/`, timeoutMs: 90_000,
  });
  if (dev) {
    await startService({
      name: 'vite', cmd: process.execPath, cwd: root, env: process.env,
      args: ['node_modules/vite/bin/vite.js', '--port', String(ports.vite), '--strictPort'],
      ready: /ready in/, timeoutMs: 60_000,
    });
  }

  const users = setup.readDemoUsers(root);
  const width = Math.max(...users.map((u) => `${u.email} / ${u.password}`.length));
  log('');
  log(`Ledgerline is running${dev ? ' (dev: Vite with hot reload, server in watch mode)' : ''}: ${origin}`);
  log('Demo sign-ins (email / password):');
  for (const u of users) log(`  ${`${u.email} / ${u.password}`.padEnd(width)}   ${u.name}, ${u.role}`);
  log(`Mail sent by the app (local fake): http://127.0.0.1:${ports.mailWeb}`);
  log(`Ports: app ${ports.app} · PostgreSQL ${ports.pg} (database ${devDatabase}) · SMTP ${ports.smtp} · mail page ${ports.mailWeb} · S3 ${ports.s3}${dev ? ` · Vite ${ports.vite}` : ''}`);
  log(`Ready in ${((Date.now() - started) / 1000).toFixed(1)} s. Press Ctrl-C to stop.`);

  const gone = await anyServiceExit();
  throw new Error(`${gone.name} stopped; stopping the rest`);
}

main().catch(async (err) => {
  // After Ctrl-C the services exit on purpose; the signal handler finishes the shutdown.
  if (isStopping()) return;
  console.error(`\nnpm start: ${err.message}`);
  await stopAll();
  process.exit(1);
});
