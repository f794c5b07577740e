// A project-local PostgreSQL cluster from Debian's packages, on 127.0.0.1 only, run as the postgres user
// (initdb and postgres refuse root). Used by `npm start` (durable) and `npm test` (fsync off).
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync, chmodSync, statSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import pg from 'pg';

const run = (cmd, args, opts = {}) => execFileSync(cmd, args, { stdio: ['ignore', 'pipe', 'pipe'], encoding: 'utf8', ...opts });
const isRoot = () => process.getuid?.() === 0;
/** Run a PostgreSQL binary as the postgres user when we are root. */
const asPostgres = (bin, args) => (isRoot() ? run('runuser', ['-u', 'postgres', '--', bin, ...args]) : run(bin, args));

/** The newest server bindir, installing Debian's postgresql package when none is present. */
export function findBinDir({ install = true, log = console.log } = {}) {
  const root = '/usr/lib/postgresql';
  const pick = () => {
    if (!existsSync(root)) return null;
    const versions = readdirSync(root).filter((v) => existsSync(join(root, v, 'bin', 'initdb'))).sort((a, b) => Number(b) - Number(a));
    return versions[0] ? join(root, versions[0], 'bin') : null;
  };
  let dir = pick();
  if (!dir && install) {
    if (!isRoot()) throw new Error('PostgreSQL server binaries are missing; install Debian\'s postgresql package (apt-get install postgresql)');
    log('Installing PostgreSQL from Debian\'s packages (apt-get)…');
    run('apt-get', ['update', '-qq'], { stdio: 'inherit' });
    run('apt-get', ['install', '-y', '-qq', '-o', 'DPkg::Lock::Timeout=600', 'postgresql'], {
      stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
    });
    dir = pick();
  }
  if (!dir) throw new Error('No PostgreSQL server binaries found under /usr/lib/postgresql');
  return dir;
}

/** Give the postgres user search permission on every parent folder of `dir` (it must reach its data). */
function makeTraversable(dir) {
  for (let d = resolve(dir); d !== '/'; d = dirname(d)) {
    const mode = statSync(d).mode;
    if ((mode & 0o001) === 0) chmodSync(d, mode | 0o001);
  }
}

/**
 * Ensure a cluster in `dataDir` runs on 127.0.0.1:`port` and that `database` exists.
 * Returns { url, stop, startedHere }. Idempotent: a running cluster is reused, not restarted.
 */
export async function ensurePostgres({ dataDir, port, database, durable = true, log = console.log }) {
  const bin = findBinDir({ log });
  dataDir = resolve(dataDir);
  const pgctl = join(bin, 'pg_ctl');
  if (!existsSync(join(dataDir, 'PG_VERSION'))) {
    log(`Creating a PostgreSQL cluster in ${dataDir}`);
    mkdirSync(dataDir, { recursive: true });
    if (isRoot()) {
      makeTraversable(dirname(dataDir));
      run('chown', ['postgres:postgres', dataDir]);
    }
    chmodSync(dataDir, 0o700);
    // Local trust over loopback only: the cluster listens on 127.0.0.1 and has no Unix socket.
    asPostgres(join(bin, 'initdb'), ['-D', dataDir, '-U', 'postgres', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8']);
  }
  const conf = [
    `listen_addresses = '127.0.0.1'`,
    `port = ${port}`,
    `unix_socket_directories = ''`,
    `fsync = ${durable ? 'on' : 'off'}`,
    `synchronous_commit = ${durable ? 'on' : 'off'}`,
    `full_page_writes = ${durable ? 'on' : 'off'}`,
    `max_connections = 200`,
    `timezone = 'UTC'`,
  ].join('\n');
  const confFile = join(dataDir, 'postgresql.auto.conf');
  writeFileSync(confFile, `# Written by scripts/lib/postgres.mjs\n${conf}\n`);
  if (isRoot()) run('chown', ['postgres:postgres', confFile]);

  const status = spawnSync(isRoot() ? 'runuser' : pgctl, isRoot() ? ['-u', 'postgres', '--', pgctl, '-D', dataDir, 'status'] : ['-D', dataDir, 'status']);
  let startedHere = false;
  if (status.status !== 0) {
    const serverLog = join(dataDir, 'server.log');
    try {
      asPostgres(pgctl, ['-D', dataDir, '-l', serverLog, '-w', '-t', '60', 'start']);
    } catch (err) {
      // pg_ctl only says "could not start server"; the reason (say, the port taken by another
      // cluster) is in the server's log: put its last lines in the error.
      const tail = existsSync(serverLog) ? readFileSync(serverLog, 'utf8').trim().split('\n').slice(-4).join('\n') : '';
      throw new Error(`PostgreSQL did not start in ${dataDir} on 127.0.0.1:${port}${tail ? `:\n${tail}` : ''}`, { cause: err });
    }
    startedHere = true;
  }
  const admin = new pg.Client({ host: '127.0.0.1', port, user: 'postgres', database: 'postgres' });
  await admin.connect();
  try {
    const { rowCount } = await admin.query('select 1 from pg_database where datname = $1', [database]);
    if (!rowCount) await admin.query(`create database "${database.replace(/"/g, '')}"`);
  } finally {
    await admin.end();
  }
  const stop = () => {
    try { asPostgres(pgctl, ['-D', dataDir, '-m', 'fast', '-w', 'stop']); } catch { /* already stopped */ }
  };
  return { url: `postgres://postgres@127.0.0.1:${port}/${database}`, stop, startedHere };
}

/** Drop and re-create a database (the test database before a run). */
export async function recreateDatabase({ port, database }) {
  const admin = new pg.Client({ host: '127.0.0.1', port, user: 'postgres', database: 'postgres' });
  await admin.connect();
  try {
    await admin.query(`drop database if exists "${database}" with (force)`);
    await admin.query(`create database "${database}"`);
  } finally {
    await admin.end();
  }
}
