// The set-up steps shared by `npm start`, `npm run dev` and `npm test`: the auth secret, migrations,
// the demo seed, the service fakes and the client build. Each step is idempotent.
import { randomBytes } from 'node:crypto';
import { chmodSync, existsSync, mkdirSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { dirname, join, relative } from 'node:path';
import { sha256 } from './install.mjs';
import { mustRun, startService } from './proc.mjs';

export const MIGRATE = 'server/db/migrate.ts';
export const SEED = 'server/db/seed/index.ts';
export const SERVER = 'server/index.ts';
export const DEMO_USERS = 'server/db/seed/demo-users.json';
const VITE = 'node_modules/vite/bin/vite.js';

/** Fail loudly, naming every file that a step needs and that is not there. */
export function requireFiles(root, files) {
  const missing = files.filter((f) => !existsSync(join(root, f)));
  if (missing.length) throw new Error(`Missing file${missing.length > 1 ? 's' : ''} needed here: ${missing.join(', ')}`);
}

/** The better-auth secret, generated once and kept readable by its owner only. */
export function ensureSecret(file) {
  if (existsSync(file)) {
    const secret = readFileSync(file, 'utf8').trim();
    if (secret.length < 32) throw new Error(`${file} holds a secret shorter than 32 characters; delete it to generate a new one`);
    if ((statSync(file).mode & 0o077) !== 0) chmodSync(file, 0o600);
    return secret;
  }
  mkdirSync(dirname(file), { recursive: true });
  const secret = randomBytes(48).toString('base64url');
  writeFileSync(file, `${secret}\n`, { mode: 0o600 });
  return secret;
}

const withEnv = (env) => ({ ...process.env, ...env });

export async function migrate(root, env) {
  requireFiles(root, [MIGRATE]);
  await mustRun('Migrations', process.execPath, ['--import', 'tsx', MIGRATE], { cwd: root, env: withEnv(env) });
}

/** The seed fills an empty database with the demo and prints nothing when there is data already. */
export async function seed(root, env) {
  requireFiles(root, [SEED]);
  await mustRun('Seed', process.execPath, ['--import', 'tsx', SEED], { cwd: root, env: withEnv(env) });
}

/** [{ email, name, role, password }] written by the seed. */
export function readDemoUsers(root) {
  requireFiles(root, [DEMO_USERS]);
  return JSON.parse(readFileSync(join(root, DEMO_USERS), 'utf8'));
}

function listFiles(root, path) {
  const full = join(root, path);
  if (!existsSync(full)) return [];
  if (!statSync(full).isDirectory()) return [path];
  return readdirSync(full, { withFileTypes: true })
    .filter((e) => e.name !== 'node_modules' && !e.name.startsWith('.'))
    .flatMap((e) => listFiles(root, relative(root, join(full, e.name))));
}

/** A hash of everything `vite build` reads: names and contents, in a stable order. */
export function clientInputsHash(root) {
  const inputs = ['src', 'shared', 'public', 'index.html', 'vite.config.ts', 'package-lock.json'];
  const files = inputs.flatMap((p) => listFiles(root, p)).sort();
  return sha256(files.map((f) => `${f}\0${sha256(readFileSync(join(root, f)))}`).join('\n'));
}

/** `vite build` when its inputs changed since the last build (or `force`). Returns true when it built. */
export async function buildClient({ root, stampFile, force = false, log = console.log }) {
  requireFiles(root, ['index.html', 'vite.config.ts']);
  const hash = clientInputsHash(root);
  const stamp = existsSync(stampFile) ? readFileSync(stampFile, 'utf8').trim() : '';
  if (!force && stamp === hash && existsSync(join(root, 'dist', 'index.html'))) return false;
  log('Building the client (vite build)…');
  await mustRun('Client build', process.execPath, [VITE, 'build', '--logLevel', 'warn'], { cwd: root });
  writeFileSync(stampFile, `${hash}\n`);
  return true;
}

/** The SMTP fake with its reading page, and the S3 fake, as child processes on loopback. */
export async function startFakes({ root, ports, mailDir, s3Dir, bucket }) {
  requireFiles(root, ['scripts/fakes/mail.mjs', 'scripts/fakes/s3.mjs']);
  const [mail, s3] = await Promise.all([
    startService({
      name: 'mail', cmd: process.execPath, cwd: root, ipc: true, ready: /^mail fake ready/, timeoutMs: 20_000,
      args: ['scripts/fakes/mail.mjs', '--smtp-port', String(ports.smtp), '--web-port', String(ports.mailWeb), '--dir', mailDir],
    }),
    startService({
      name: 's3', cmd: process.execPath, cwd: root, ipc: true, ready: /^s3 fake ready/, timeoutMs: 20_000,
      args: ['scripts/fakes/s3.mjs', '--port', String(ports.s3), '--dir', s3Dir, '--bucket', bucket],
    }),
  ]);
  return { mail, s3 };
}

/**
 * Debian packages the tests need, installed with apt-get when their binary is missing: Chromium for the
 * browser tests (never a downloaded browser build) and poppler-utils, whose `pdftotext` reads the
 * generated PDFs back. Returns the packages it installed.
 */
export const TEST_PACKAGES = [
  { pkg: 'chromium', bin: '/usr/bin/chromium' },
  { pkg: 'poppler-utils', bin: '/usr/bin/pdftotext' },
];

export async function ensureDebianPackages(wanted = TEST_PACKAGES, { log = console.log } = {}) {
  const missing = wanted.filter((w) => !existsSync(w.bin));
  if (!missing.length) return [];
  const names = missing.map((m) => m.pkg);
  if (process.getuid?.() !== 0) throw new Error(`Missing Debian packages: ${names.join(', ')} (apt-get install -y ${names.join(' ')})`);
  log(`Installing ${names.join(', ')} from Debian's packages (apt-get)…`);
  const env = { DEBIAN_FRONTEND: 'noninteractive' };
  await mustRun('apt-get update', 'apt-get', ['update', '-qq'], { env: withEnv(env) });
  await mustRun(`Installing ${names.join(', ')}`, 'apt-get', ['install', '-y', '-qq', '-o', 'DPkg::Lock::Timeout=600', ...names], { env: withEnv(env) });
  for (const m of missing) if (!existsSync(m.bin)) throw new Error(`apt-get installed ${m.pkg} but ${m.bin} is not there`);
  return names;
}
