import { createStore, del, entries, set } from 'idb-keyval';
import { deviceUsageSchema, type CreateDeviceUsageInput, type DeviceUsage } from '#shared/schemas/device-usages.ts';
import { api, ApiError, NetworkError } from '@/lib/api.ts';

/**
 * Scans waiting for the server, kept in IndexedDB so a scan survives a reload or a dropped network like
 * a tap does. Each has its id made here (UUIDv7), so a resend after a lost answer stores it once. A scan
 * whose tap has not reached the server yet (409 on eventId) waits and is sent again.
 */
export type PendingUsage = { caseId: string; body: CreateDeviceUsageInput & { id: string }; attempts: number; lastError: string | null };
export type SendResult = { status: 'stored'; usage: DeviceUsage } | { status: 'waiting'; reason: string } | { status: 'refused'; reason: string };

const store = typeof indexedDB === 'undefined' ? undefined : createStore('ledgerline-devices', 'pending-usages');
const RETRY_MS = 15_000;
let timer: ReturnType<typeof setTimeout> | undefined;

/** POST /api/cases/:caseId/device-usages once. */
export function postUsage(caseId: string, body: CreateDeviceUsageInput) {
  return api(`/api/cases/${encodeURIComponent(caseId)}/device-usages`, { method: 'POST', body, schema: deviceUsageSchema });
}

function retryable(err: unknown): boolean {
  if (err instanceof NetworkError) return true;
  if (err instanceof ApiError) return err.status >= 500 || err.status === 429 || (err.status === 409 && err.issues.some((i) => i.path === 'eventId'));
  return false;
}

async function attempt(p: PendingUsage): Promise<SendResult> {
  try {
    const usage = await postUsage(p.caseId, p.body);
    if (store) await del(p.body.id, store);
    return { status: 'stored', usage };
  } catch (err) {
    const reason = err instanceof Error ? err.message : String(err);
    if (retryable(err)) {
      if (store) await set(p.body.id, { ...p, attempts: p.attempts + 1, lastError: reason }, store);
      schedule();
      return { status: 'waiting', reason };
    }
    if (store) await del(p.body.id, store);
    return { status: 'refused', reason };
  }
}

function schedule(): void {
  if (timer || typeof window === 'undefined') return;
  timer = setTimeout(() => { timer = undefined; void flushUsages(); }, RETRY_MS);
}

/** Keep the scan on the tablet, then try to send it now. */
export async function queueUsage(caseId: string, body: CreateDeviceUsageInput & { id: string }): Promise<SendResult> {
  const pending: PendingUsage = { caseId, body, attempts: 0, lastError: null };
  if (store) await set(body.id, pending, store);
  return attempt(pending);
}

/** Send every scan still waiting (on a timer, and when the browser says it is back online). */
export async function flushUsages(): Promise<void> {
  if (!store) return;
  for (const [, value] of await entries<string, PendingUsage>(store)) await attempt(value);
}

/** Scans still waiting, for a screen that shows them. */
export async function pendingUsages(): Promise<PendingUsage[]> {
  return store ? (await entries<string, PendingUsage>(store)).map(([, v]) => v) : [];
}

if (typeof window !== 'undefined') window.addEventListener('online', () => void flushUsages());
