// What `npm run bench` runs against: the test PostgreSQL cluster with a bench database of its own, the
// mail and S3 fakes and the real server with the built client, each on a free loopback port. Every
// piece started here is stopped by `stop()`, in reverse order; what was already running is left alone.
import { spawn, spawnSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { mkdirSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { join } from 'node:path';
import { ensurePostgres, recreateDatabase } from '../lib/postgres.mjs';
import { dataDirs, serverEnv, testPorts } from '../lib/ports.mjs';
import { startMailFake } from '../fakes/mail.mjs';
import { startS3Fake } from '../fakes/s3.mjs';
import { buildClient } from '../lib/setup.mjs';

export const BENCH_DATABASE = 'ledgerline_bench';

/** A port nobody listens on now (the OS picks it), on loopback. */
export function freePort() {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.unref();
    srv.on('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address();
      srv.close(() => resolve(port));
    });
  });
}

function runNode(root, args, env, what) {
  const r = spawnSync(process.execPath, args, { cwd: root, env: { ...process.env, ...env }, encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`${what} failed (exit ${r.status}):\n${r.stderr || r.stdout}`);
}

async function waitForHttp(url, child, timeoutMs = 60_000) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`The server exited with ${child.exitCode} before it answered`);
    try {
      const res = await fetch(url);
      if (res.status < 500) return;
    } catch { /* not listening yet */ }
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`The server did not answer at ${url} within ${timeoutMs} ms`);
}

/**
 * Bring everything up; returns { origin, databaseUrl, stop }. `env` overrides the server's environment;
 * `port` fixes the server's port (else a free one).
 */
export async function startStack({ root, log = console.log, env: extraEnv = {}, port = null }) {
  const stops = [];
  const stop = async () => {
    for (const s of stops.reverse()) {
      try { await s(); } catch (err) { log(`  (stopping: ${err.message})`); }
    }
    stops.length = 0;
  };
  try {
    const dirs = dataDirs(root);
    const pg = await ensurePostgres({ dataDir: dirs.pgTest, port: testPorts.pg, database: BENCH_DATABASE, durable: false, log });
    if (pg.startedHere) stops.push(() => pg.stop());
    await recreateDatabase({ port: testPorts.pg, database: BENCH_DATABASE });

    // The same stamped build as `npm start`: rebuilt whenever the client's sources changed, so the bench
    // never measures a stale bundle.
    await buildClient({ root, stampFile: dirs.buildStamp, log });

    const ports = { ...testPorts, app: port ?? await freePort(), smtp: await freePort(), mailWeb: await freePort(), s3: await freePort() };
    const mailDir = join(dirs.data, 'bench-mail');
    const s3Dir = join(dirs.data, 'bench-s3');
    for (const d of [mailDir, s3Dir]) { rmSync(d, { recursive: true, force: true }); mkdirSync(d, { recursive: true }); }
    const mail = await startMailFake({ smtpPort: ports.smtp, webPort: ports.mailWeb, dir: mailDir, log: () => {} });
    stops.push(() => mail.close());
    const s3 = await startS3Fake({ port: ports.s3, dir: s3Dir });
    stops.push(() => s3.close());

    const secret = randomBytes(32).toString('hex');
    const env = { ...serverEnv({ ports, database: BENCH_DATABASE, secret, nodeEnv: 'production' }), LOG_LEVEL: 'warn', ...extraEnv };
    log('Migrating and seeding the bench database…');
    runNode(root, ['--import', 'tsx', 'server/db/migrate.ts'], env, 'Migration');
    runNode(root, ['--import', 'tsx', 'server/db/seed/index.ts'], env, 'Seeding');

    log(`Starting the server on 127.0.0.1:${ports.app}…`);
    // `node --import tsx` so the pid held is the server itself (STACK.md).
    const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], { cwd: root, env: { ...process.env, ...env }, stdio: ['ignore', 'ignore', 'pipe'] });
    let stderr = '';
    child.stderr.on('data', (d) => { stderr = (stderr + d).slice(-4000); });
    stops.push(() => new Promise((resolve) => {
      if (child.exitCode !== null) return resolve();
      child.once('exit', () => resolve());
      child.kill('SIGTERM');
      setTimeout(() => { if (child.exitCode === null) child.kill('SIGKILL'); }, 5_000).unref();
    }));
    const origin = `http://localhost:${ports.app}`;
    await waitForHttp(`http://127.0.0.1:${ports.app}/`, child).catch((err) => { throw new Error(`${err.message}\n${stderr}`); });
    return { origin, databaseUrl: pg.url, stop, serverErrors: () => stderr };
  } catch (err) {
    await stop();
    throw err;
  }
}
