import { v7 as uuidv7 } from 'uuid';
import { vi } from 'vitest';
import { createSyncEngine, createSyncSocket, type SyncEngine, type SyncEngineOptions } from '@/sync/index.ts';

/** Nothing listens on port 1 of loopback: a socket there stays offline (connection refused). */
export const OFFLINE_URL = 'http://127.0.0.1:1';

const engines: SyncEngine[] = [];

/** A "tablet": a sync engine over its own IndexedDB database (reuse `dbName` to reload the same tablet). */
export function startTablet(url: string, opts: Partial<SyncEngineOptions> & { dbName: string }): SyncEngine {
  const socket = createSyncSocket(url, { reconnectionDelay: 50, reconnectionDelayMax: 200, transports: ['websocket'] });
  const engine = createSyncEngine({ socket, author: 'user-test-nurse', ackTimeoutMs: 1_000, retryDelaysMs: [50, 100], clock: { burst: 3 }, ...opts });
  engines.push(engine);
  return engine;
}

/** Stop every tablet started by the test (their IndexedDB data stays, as after closing the browser). */
export async function stopTablets(): Promise<void> {
  await Promise.all(engines.splice(0).map((e) => e.stop()));
}

export const newDbName = () => `ledgerline-test-${uuidv7()}`;
export const newCaseId = () => uuidv7();

/** Wait until `check` passes (vitest's waitFor, with a short interval). */
export const eventually = <T>(check: () => T | Promise<T>, timeout = 5_000) => vi.waitFor(check, { timeout, interval: 10 });

/** A fresh connection to a tablet's database, as a reload would open it. */
function openRaw(dbName: string): Promise<IDBDatabase> {
  return new Promise((resolve, reject) => {
    const r = indexedDB.open(dbName);
    r.onsuccess = () => resolve(r.result);
    r.onerror = () => reject(r.error);
  });
}

/** Read the outbox rows straight from IndexedDB over a fresh connection (what a reload would find). */
export async function readOutboxRaw(dbName: string): Promise<{ state: string; event: { id: string } }[]> {
  const db = await openRaw(dbName);
  try {
    return await new Promise((resolve, reject) => {
      const r = db.transaction('outbox', 'readonly').objectStore('outbox').getAll();
      r.onsuccess = () => resolve(r.result);
      r.onerror = () => reject(r.error);
    });
  } finally {
    db.close();
  }
}

/** Change the outbox rows in IndexedDB directly (what an earlier version of the app may have left). */
export async function rewriteOutboxRaw(dbName: string, change: (row: Record<string, unknown>) => Record<string, unknown>): Promise<void> {
  const db = await openRaw(dbName);
  try {
    await new Promise<void>((resolve, reject) => {
      const tx = db.transaction('outbox', 'readwrite');
      const store = tx.objectStore('outbox');
      const r = store.openCursor();
      r.onsuccess = () => {
        const cursor = r.result;
        if (!cursor) return;
        cursor.update(change(cursor.value as Record<string, unknown>));
        cursor.continue();
      };
      tx.oncomplete = () => resolve();
      tx.onerror = () => reject(tx.error);
    });
  } finally {
    db.close();
  }
}
