// Step (a) of `npm start` and `npm test`: install packages when node_modules is missing or stale.
// Node built-ins only: this runs before any package can be imported.
import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';

export const sha256 = (data) => createHash('sha256').update(data).digest('hex');

/**
 * Does node_modules hold what package-lock.json asks for? npm writes its own record of what it
 * installed to node_modules/.package-lock.json; every package there must match the lock, and every
 * package of the lock must be there, except optional ones skipped on this platform.
 */
export function installMatchesLock(root) {
  const hiddenFile = join(root, 'node_modules', '.package-lock.json');
  if (!existsSync(hiddenFile)) return false;
  const lock = JSON.parse(readFileSync(join(root, 'package-lock.json'), 'utf8')).packages ?? {};
  const hidden = JSON.parse(readFileSync(hiddenFile, 'utf8')).packages ?? {};
  for (const [path, entry] of Object.entries(lock)) {
    if (path === '' || !path.startsWith('node_modules/')) continue;
    const have = hidden[path];
    if (!have) {
      if (entry.optional || entry.devOptional) continue;
      return false;
    }
    if (have.version !== entry.version) return false;
    if (!existsSync(join(root, path))) return false;
  }
  for (const path of Object.keys(hidden)) if (!(path in lock)) return false;
  return true;
}

/**
 * Run `npm ci` unless the lock's hash matches the one kept from the last install (or node_modules
 * already matches the lock, as in a checkout where someone else installed). Returns true when it installed.
 */
export function ensurePackages({ root, stampFile, log = console.log }) {
  const lockFile = join(root, 'package-lock.json');
  if (!existsSync(lockFile)) throw new Error('package-lock.json is missing: it pins every package (run `npm install` once and commit it)');
  const hash = sha256(readFileSync(lockFile));
  const stamp = existsSync(stampFile) ? readFileSync(stampFile, 'utf8').trim() : '';
  const hiddenLock = join(root, 'node_modules', '.package-lock.json');
  if (stamp === hash && existsSync(hiddenLock)) return false;
  mkdirSync(dirname(stampFile), { recursive: true });
  if (installMatchesLock(root)) {
    writeFileSync(stampFile, `${hash}\n`);
    return false;
  }
  log(existsSync(join(root, 'node_modules')) ? 'Packages changed: npm ci…' : 'Installing packages: npm ci…');
  execFileSync('npm', ['ci', '--no-audit', '--no-fund', '--loglevel=error'], { cwd: root, stdio: 'inherit' });
  writeFileSync(stampFile, `${hash}\n`);
  return true;
}
