import { createStore, del, entries, get, keys, set } from 'idb-keyval';
import { deviceUsageSchema, type CreateDeviceUsageInput, type DeviceUsage } from '#shared/schemas/device-usages.ts';
import { api, ApiError, NetworkError } from '@/lib/api.ts';

/**
 * Scans waiting for the server, kept in IndexedDB so a scan survives a reload or a dropped network like
 * a tap does. Each has its id made here (UUIDv7), so a resend after a lost answer stores it once. A scan
 * whose tap has not reached the server yet (409 on eventId) waits and is sent again, soon at first.
 */
export type PendingUsage = { caseId: string; body: CreateDeviceUsageInput & { id: string }; attempts: number; lastError: string | null };
export type SendResult = { status: 'stored'; usage: DeviceUsage } | { status: 'waiting'; reason: string } | { status: 'refused'; reason: string };

const store = typeof indexedDB === 'undefined' ? undefined : createStore('ledgerline-devices', 'pending-usages');
/** The longest wait between two tries. */
const RETRY_MS = 15_000;
/** The first wait after a 409 on eventId: the tap is usually on the server a moment later (doubles each try)… */
const FIRST_RETRY_MS = 500;
/** …up to this: the tap's own push retries within seconds once the socket is back. */
const TAP_RETRY_MS = 5_000;
/**
 * A scan whose tap the server still does not know after this many tries (about 5 minutes) stops being
 * retried on a timer: it stays kept and shown as waiting, and is sent again when the browser comes back
 * online or a scan field opens. A tap refused by the server never arrives, so this bounds the cost of waiting.
 */
const MAX_TAP_TRIES = 64;

let timer: ReturnType<typeof setTimeout> | undefined;
let timerAt = Infinity;
const inFlight = new Set<string>();
const listeners = new Set<(id: string, result: SendResult) => void>();

/** POST /api/cases/:caseId/device-usages once. */
export function postUsage(caseId: string, body: CreateDeviceUsageInput) {
  return api(`/api/cases/${encodeURIComponent(caseId)}/device-usages`, { method: 'POST', body, schema: deviceUsageSchema });
}

const tapNotThereYet = (err: unknown) => err instanceof ApiError && err.status === 409 && err.issues.some((i) => i.path === 'eventId');

function retryable(err: unknown): boolean {
  if (err instanceof NetworkError || tapNotThereYet(err)) return true;
  // 401: the session ran out mid-case; the scan waits for the next sign-in rather than being lost.
  return err instanceof ApiError && (err.status >= 500 || err.status === 429 || err.status === 401);
}

/** Every later answer for a scan (a retry that stored it, or refused it), for a screen that shows it. */
export function onUsageResult(fn: (id: string, result: SendResult) => void): () => void {
  listeners.add(fn);
  return () => void listeners.delete(fn);
}

async function attempt(p: PendingUsage): Promise<SendResult> {
  if (inFlight.has(p.body.id)) return { status: 'waiting', reason: p.lastError ?? 'Being sent' };
  inFlight.add(p.body.id);
  let result: SendResult;
  try {
    const usage = await postUsage(p.caseId, p.body);
    if (store) await del(p.body.id, store);
    result = { status: 'stored', usage };
  } catch (err) {
    const reason = err instanceof Error ? err.message : String(err);
    if (retryable(err)) {
      const attempts = p.attempts + 1;
      if (store) await set(p.body.id, { ...p, attempts, lastError: reason }, store);
      // A network or server outage waits at the longest step for as long as it lasts; a missing tap backs off, then stops.
      if (!tapNotThereYet(err)) schedule(RETRY_MS);
      else if (attempts < MAX_TAP_TRIES) schedule(Math.min(TAP_RETRY_MS, FIRST_RETRY_MS * 2 ** (attempts - 1)));
      result = { status: 'waiting', reason };
    } else {
      if (store) await del(p.body.id, store);
      result = { status: 'refused', reason };
    }
  } finally {
    inFlight.delete(p.body.id);
  }
  for (const fn of listeners) fn(p.body.id, result);
  return result;
}

/** One timer for the whole outbox, brought forward when a scan needs a sooner try. */
function schedule(delayMs: number): void {
  if (typeof window === 'undefined') return;
  const at = Date.now() + delayMs;
  if (timer && timerAt <= at) return;
  clearTimeout(timer);
  timerAt = at;
  timer = setTimeout(() => { timer = undefined; timerAt = Infinity; void flushUsages(); }, delayMs);
}

/** Keep the scan on the tablet, then try to send it now. */
export async function queueUsage(caseId: string, body: CreateDeviceUsageInput & { id: string }): Promise<SendResult> {
  const pending: PendingUsage = { caseId, body, attempts: 0, lastError: null };
  if (store) await set(body.id, pending, store);
  return attempt(pending);
}

/**
 * Send every scan still waiting (on the timer, when the browser says it is back online, and when the
 * capture screen's scan field opens). `fresh` gives scans that had stopped waiting for their tap a new round of tries.
 */
export async function flushUsages(fresh = false): Promise<void> {
  if (!store) return;
  for (const id of await keys<string>(store)) {
    // Read again: a scan stored by another try since the list was read is not sent again.
    const current = await get<PendingUsage>(id, store);
    if (current) await attempt(fresh ? { ...current, attempts: 0 } : current);
  }
}

/** Scans still waiting, for a screen that shows them. */
export async function pendingUsages(): Promise<PendingUsage[]> {
  return store ? (await entries<string, PendingUsage>(store)).map(([, v]) => v) : [];
}

if (typeof window !== 'undefined') window.addEventListener('online', () => void flushUsages(true));
