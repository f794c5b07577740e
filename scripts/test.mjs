// `npm test`: the same set-up as `npm start` against a separate, fsync-off PostgreSQL cluster and fakes on
// their own ports, then typecheck, lint, vitest, vite build and Playwright. Everything it started is
// stopped at the end, whatever happened; the exit code is non-zero when any step failed. The last line
// is `N passed, N failed` (tests counted from the vitest and Playwright JSON reports).
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { ensurePackages } from './lib/install.mjs';
import { dataDirs, databaseUrl, e2eDatabase, integrationDatabase, S3_BUCKET, serverEnv, testPorts } from './lib/ports.mjs';
import { assertPortFree, onCleanup, run, stopAll, stopOnSignals } from './lib/proc.mjs';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const dirs = dataDirs(root);
const ports = testPorts;
const results = join(root, 'test-results');
const log = (line) => console.log(line);
const bin = (path) => join(root, 'node_modules', path);
const MIN = 60_000;

/** @type {{ name: string, status: 'passed' | 'failed' | 'skipped', ms: number, note?: string }[]} */
const steps = [];
const counts = { passed: 0, failed: 0 };

async function step(name, fn) {
  const t0 = Date.now();
  log(`\n▶ ${name}`);
  try {
    const note = await fn();
    steps.push({ name, status: 'passed', ms: Date.now() - t0, note: note || undefined });
    return true;
  } catch (err) {
    steps.push({ name, status: 'failed', ms: Date.now() - t0, note: err.message.split('\n')[0] });
    console.error(`✗ ${name}: ${err.message}`);
    return false;
  }
}
const skip = (name, why) => steps.push({ name, status: 'skipped', ms: 0, note: why });

const readJson = (file) => (existsSync(file) ? JSON.parse(readFileSync(file, 'utf8')) : null);

/** A runner that failed without reporting a failed test (a crash, a config error) still counts one. */
function count(passed, failed, code) {
  counts.passed += passed;
  counts.failed += failed || (code !== 0 ? 1 : 0);
  if (code !== 0) throw new Error(`exit code ${code}${failed ? `, ${failed} failed` : ''}`);
  return `${passed} passed`;
}

async function main() {
  let ready = await step('packages', () => (ensurePackages({ root, stampFile: dirs.installStamp, log }) ? 'npm ci' : 'up to date'));
  if (!ready) return;
  const { ensurePostgres, recreateDatabase } = await import('./lib/postgres.mjs');
  const setup = await import('./lib/setup.mjs');
  let secret = '';
  let integrationEnv = {};
  let e2eEnv = {};

  ready = await step('set-up', async () => {
    setup.requireFiles(root, [setup.SERVER, setup.MIGRATE, setup.SEED, 'playwright.config.ts', 'vitest.config.ts', 'eslint.config.js']);
    for (const [port, what] of [[ports.app, 'browser-test server'], [ports.smtp, 'test SMTP fake'], [ports.mailWeb, 'test mail page'], [ports.s3, 'test S3 fake']]) {
      await assertPortFree(port, what);
    }
    const installed = await setup.ensureDebianPackages(setup.TEST_PACKAGES, { log });
    const pg = await ensurePostgres({ dataDir: dirs.pgTest, port: ports.pg, database: integrationDatabase, durable: false, log });
    if (pg.startedHere) onCleanup(() => { log('Stopping the test PostgreSQL cluster…'); pg.stop(); });
    secret = setup.ensureSecret(dirs.authSecret);
    integrationEnv = { ...process.env, ...serverEnv({ ports, database: integrationDatabase, secret, nodeEnv: 'test' }) };
    e2eEnv = { ...process.env, ...serverEnv({ ports, database: e2eDatabase, secret, nodeEnv: 'test' }) };
    for (const database of [integrationDatabase, e2eDatabase]) await recreateDatabase({ port: ports.pg, database });
    await setup.migrate(root, integrationEnv);
    await setup.migrate(root, e2eEnv);
    await setup.seed(root, e2eEnv);
    // Each run starts with no mail and no objects, so a test reads only what this run sent.
    for (const dir of [dirs.testMail, dirs.testS3]) rmSync(dir, { recursive: true, force: true });
    await setup.startFakes({ root, ports, mailDir: dirs.testMail, s3Dir: dirs.testS3, bucket: S3_BUCKET });
    rmSync(results, { recursive: true, force: true });
    mkdirSync(results, { recursive: true });
    return `${installed.length ? `installed ${installed.join(', ')}; ` : ''}${databaseUrl(ports.pg, integrationDatabase)}, ${databaseUrl(ports.pg, e2eDatabase)}`;
  });
  if (!ready) return;

  await step('typecheck', async () => {
    const code = await run(process.execPath, [bin('typescript/bin/tsc'), '--noEmit', '-p', 'tsconfig.json'], { cwd: root, timeoutMs: 5 * MIN });
    if (code !== 0) throw new Error(`tsc exit code ${code}`);
  });
  await step('lint', async () => {
    const code = await run(process.execPath, [bin('eslint/bin/eslint.js'), '.', '--max-warnings=0'], { cwd: root, timeoutMs: 5 * MIN });
    if (code !== 0) throw new Error(`eslint exit code ${code}`);
  });
  await step('vitest', async () => {
    const file = join(results, 'vitest.json');
    const code = await run(process.execPath, [bin('vitest/vitest.mjs'), 'run', '--reporter=default', '--reporter=json', `--outputFile.json=${file}`],
      { cwd: root, env: integrationEnv, timeoutMs: 8 * MIN });
    const report = readJson(file);
    return count(report?.numPassedTests ?? 0, report?.numFailedTests ?? 0, code);
  });
  const built = await step('build', async () => {
    await setup.buildClient({ root, stampFile: dirs.buildStamp, force: true, log });
  });
  if (!built) {
    skip('playwright', 'the client build failed');
  } else {
    await step('playwright', async () => {
      // playwright.config.ts writes its JSON report here.
      const file = join(results, 'playwright.json');
      const code = await run(process.execPath, [bin('@playwright/test/cli.js'), 'test'],
        { cwd: root, env: e2eEnv, timeoutMs: 12 * MIN });
      const stats = readJson(file)?.stats;
      return count((stats?.expected ?? 0) + (stats?.flaky ?? 0), stats?.unexpected ?? 0, code);
    });
  }
}

function summary() {
  const seconds = (ms) => `${(ms / 1000).toFixed(1)} s`;
  const width = Math.max(...steps.map((s) => s.name.length));
  log('');
  log(`${'Step'.padEnd(width)}  Result      Time   Note`);
  for (const s of steps) {
    log(`${s.name.padEnd(width)}  ${s.status.padEnd(7)}  ${seconds(s.ms).padStart(7)}   ${s.note ?? ''}`);
  }
  log(`${'total'.padEnd(width)}  ${''.padEnd(7)}  ${seconds(Date.now() - startedAt).padStart(7)}`);
  const failedSteps = steps.filter((s) => s.status === 'failed').map((s) => s.name);
  if (failedSteps.length) log(`Failed steps: ${failedSteps.join(', ')}`);
  log(`${counts.passed} passed, ${counts.failed} failed`);
  return failedSteps.length === 0 && steps.length > 0;
}

const startedAt = Date.now();
stopOnSignals(log);
let ok = false;
try {
  await main();
} catch (err) {
  steps.push({ name: 'test runner', status: 'failed', ms: 0, note: err.message });
  console.error(err);
} finally {
  await stopAll();
  ok = summary();
}
process.exit(ok ? 0 : 1);
