// Child processes for the start and test scripts: foreground steps that must succeed, and long-running
// services that print a ready line or answer HTTP. Everything started is stopped, newest first, on
// Ctrl-C, on SIGTERM and at the end, whatever happened.
import { spawn } from 'node:child_process';
import { createServer } from 'node:net';
import { createInterface } from 'node:readline';

const services = [];
const cleanups = [];
let current = null;
let stopping = null;

/**
 * Run a command to completion with inherited output. Resolves with its exit code (signal → 1).
 * Past `timeoutMs` the command is stopped (SIGTERM, then SIGKILL) and counts as failed.
 */
export function run(cmd, args, { env, cwd, timeoutMs } = {}) {
  return new Promise((resolve, reject) => {
    const child = spawn(cmd, args, { cwd, env: env ?? process.env, stdio: ['ignore', 'inherit', 'inherit'] });
    current = child;
    const timer = timeoutMs && setTimeout(() => {
      process.stderr.write(`\n${cmd} ${args.join(' ')}: still running after ${timeoutMs / 1000} s, stopping it\n`);
      void stopChild(child, 5000);
    }, timeoutMs);
    child.once('error', (err) => { clearTimeout(timer); current = null; reject(err); });
    child.once('exit', (code, signal) => {
      clearTimeout(timer);
      current = null;
      resolve(code ?? (signal ? 1 : 0));
    });
  });
}

/** Run a command and throw, naming the step, when it fails. */
export async function mustRun(what, cmd, args, options) {
  const code = await run(cmd, args, options);
  if (code !== 0) throw new Error(`${what} failed (exit code ${code}): ${cmd} ${args.join(' ')}`);
}

/** Throw a clear error when something already listens on 127.0.0.1:port. */
export function assertPortFree(port, what) {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once('error', (err) => reject(err.code === 'EADDRINUSE'
      ? new Error(`Port ${port} (${what}) is already in use: is another \`npm start\` or \`npm test\` running? (\`ss -ltnp | grep ${port}\` shows who)`)
      : err));
    probe.listen(port, '127.0.0.1', () => probe.close(() => resolve()));
  });
}

const prefixLines = (stream, name, out, onLine) => {
  createInterface({ input: stream }).on('line', (line) => {
    out.write(`[${name}] ${line}\n`);
    onLine?.(line);
  });
};

/**
 * Start a long-running child. Ready when a line matches `ready` (a RegExp), or when `readyUrl`
 * answers HTTP (any status). Node children get an IPC channel so they can notice a parent that died.
 */
export function startService({ name, cmd, args, env, cwd, ready, readyUrl, timeoutMs = 60_000, ipc = false }) {
  return new Promise((resolve, reject) => {
    const child = spawn(cmd, args, { cwd, env: env ?? process.env, stdio: ['ignore', 'pipe', 'pipe', ...(ipc ? ['ipc'] : [])] });
    const service = { name, child, exited: false };
    services.push(service);
    let settled = false;
    const done = (err) => {
      if (settled) return;
      settled = true;
      clearTimeout(timer);
      if (err) reject(err); else resolve(service);
    };
    const timer = setTimeout(() => done(new Error(`${name} was not ready within ${timeoutMs / 1000} s`)), timeoutMs);
    const onLine = ready ? (line) => { if (ready.test(line)) done(); } : undefined;
    prefixLines(child.stdout, name, process.stdout, onLine);
    prefixLines(child.stderr, name, process.stderr, onLine);
    child.once('error', done);
    child.once('exit', (code, signal) => {
      service.exited = true;
      done(new Error(`${name} exited before it was ready (${signal ?? `exit code ${code}`})`));
      if (settled && !stopping) process.stderr.write(`[${name}] stopped unexpectedly (${signal ?? `exit code ${code}`})\n`);
    });
    if (readyUrl) {
      const poll = async () => {
        while (!settled) {
          try {
            await fetch(readyUrl, { signal: AbortSignal.timeout(2000) });
            return done();
          } catch {
            await new Promise((r) => setTimeout(r, 250));
          }
        }
      };
      void poll();
    }
  });
}

/** Resolves when any service exits (for `npm start`, which runs until stopped). */
export const anyServiceExit = () => Promise.race(services.map((s) => new Promise((r) => {
  if (s.exited) r(s); else s.child.once('exit', () => r(s));
})));

/** True once a shutdown has begun (a signal or the end of the run). */
export const isStopping = () => stopping !== null;

/** Run `fn` at shutdown, after the services have stopped (e.g. stop a database cluster). */
export const onCleanup = (fn) => cleanups.push(fn);

function stopChild(child, graceMs) {
  if (child.exitCode !== null || child.signalCode !== null) return Promise.resolve();
  return new Promise((resolve) => {
    const kill = setTimeout(() => child.kill('SIGKILL'), graceMs);
    child.once('exit', () => { clearTimeout(kill); resolve(); });
    child.kill('SIGTERM');
  });
}

/** Stop every service (newest first), the running step, then the cleanups. Safe to call twice. */
export function stopAll({ graceMs = 8000 } = {}) {
  stopping ??= (async () => {
    if (current) await stopChild(current, graceMs);
    for (const s of services.slice().reverse()) await stopChild(s.child, graceMs);
    for (const fn of cleanups.reverse()) {
      try { await fn(); } catch (err) { process.stderr.write(`cleanup failed: ${err.message}\n`); }
    }
  })();
  return stopping;
}

/** On SIGINT/SIGTERM: stop everything, say so, and exit (130 for Ctrl-C, 143 for SIGTERM). */
export function stopOnSignals(log = console.log) {
  for (const [signal, code] of [['SIGINT', 130], ['SIGTERM', 143]]) {
    process.on(signal, () => {
      if (stopping) return;
      log(`\n${signal === 'SIGINT' ? 'Ctrl-C' : signal}: stopping everything this run started…`);
      void stopAll().then(() => { log('Stopped.'); process.exit(code); });
    });
  }
}
