import { get, promisifyRequest, set, type UseStore } from 'idb-keyval';
import type { StoredEvent } from '#shared/schemas/events.ts';
import { keptOutboxEntry, outboxEntrySchema, type OutboxEntry, type AuditEntry } from './outbox.ts';

/**
 * What the tablet keeps in IndexedDB (one database, default name "ledgerline"):
 *   outbox  key event id            → OutboxEntry (events not yet accepted, and refused ones); a tap is
 *                                      written with durability 'strict', so it survives a crash or power loss
 *   events  key [caseId, seq]       → StoredEvent (the accepted log of each opened case, for offline reloads)
 *   meta    key 'deviceId' | 'clock' → the tablet's id; the last clock estimate
 *   audit   key auto-increment      → AuditEntry (what a person discarded or replaced, kept on the tablet)
 * idb-keyval's own createStore makes one store per database, so the stores are opened here and handed
 * to idb-keyval's functions as its `UseStore`.
 */
const STORES = ['outbox', 'events', 'meta', 'audit'] as const;
type StoreName = (typeof STORES)[number];

export type WriteReceipt = { durability: IDBTransactionDurability; ms: number };

export type SyncStorage = ReturnType<typeof openSyncStorage>;

/**
 * A person's decision about a refused event: the audit entry, and the refused row out of the outbox.
 * Written in the same transaction as the event that replaces it or records the discard, so that a tab
 * that dies meanwhile leaves all of it or none (never the refused event beside its replacement).
 */
export type Settlement = { audit: AuditEntry; drop: string };

function settle(tx: IDBTransaction, { audit, drop }: Settlement): void {
  tx.objectStore('audit').add(audit);
  tx.objectStore('outbox').delete(drop);
}

export function openSyncStorage(dbName = 'ledgerline', now: () => number = () => performance.now()) {
  let dbp: Promise<IDBDatabase> | undefined;
  // The open connection once it is there, so that a tap's write can start synchronously, inside the tap.
  let opened: IDBDatabase | undefined;
  const getDb = () => {
    if (dbp) return dbp;
    const request = indexedDB.open(dbName, 1);
    request.onupgradeneeded = () => {
      for (const name of STORES) {
        if (!request.result.objectStoreNames.contains(name)) {
          request.result.createObjectStore(name, name === 'audit' ? { autoIncrement: true } : undefined);
        }
      }
    };
    dbp = promisifyRequest(request);
    dbp.then((db) => { opened = db; db.onclose = () => { dbp = undefined; opened = undefined; }; }, () => { dbp = undefined; });
    return dbp;
  };
  const store = (name: StoreName, durability: IDBTransactionDurability = 'default'): UseStore =>
    (mode, callback) => getDb().then((db) => callback(db.transaction(name, mode, { durability }).objectStore(name)));

  const outbox = store('outbox', 'strict');
  const events = store('events');
  const meta = store('meta');
  const audit = store('audit', 'strict');
  const caseRange = (caseId: string) => IDBKeyRange.bound([caseId, 0], [caseId, Infinity]);

  return {
    /**
     * Write one outbox entry and resolve once its transaction has committed (the `complete` event of a
     * 'strict' transaction: flushed to disk, not only to the OS). Returns what was asked and how long it took.
     */
    putOutbox(entry: OutboxEntry, settles?: Settlement): Promise<WriteReceipt> {
      const started = now();
      const write = (db: IDBDatabase): Promise<WriteReceipt> => {
        const tx = db.transaction(settles ? ['outbox', 'audit'] : 'outbox', 'readwrite', { durability: 'strict' });
        try {
          tx.objectStore('outbox').put(entry, entry.event.id);
          if (settles) settle(tx, settles);
        } catch (err) {
          tx.abort(); // a write refused at once (a value IndexedDB cannot hold): none of the others either
          throw err;
        }
        // Commit now, without waiting for the put's success event: that event is a task on the page's
        // thread, which after a tap is busy drawing it, and an implicit commit waits for it.
        tx.commit?.();
        return promisifyRequest(tx).then(() => ({ durability: tx.durability, ms: now() - started }));
      };
      // With the connection open the transaction is created in this call, before the caller draws
      // anything: the disk write runs while the tap's frame is rendered, not after it.
      if (opened) {
        try {
          return write(opened);
        } catch (err) {
          // Closed meanwhile: open again. Any other failure (a value it cannot hold) is the write's own.
          if (!(err instanceof DOMException && err.name === 'InvalidStateError')) return Promise.reject(err);
          opened = undefined;
          dbp = undefined;
        }
      }
      return getDb().then(write);
    },
    /** A person's decision about a refused event with no new event to write: its audit entry and its removal, together. */
    async settleRefused(settles: Settlement): Promise<void> {
      const db = await getDb();
      const tx = db.transaction(['outbox', 'audit'], 'readwrite', { durability: 'strict' });
      try { settle(tx, settles); } catch (err) { tx.abort(); throw err; }
      tx.commit?.();
      await promisifyRequest(tx);
    },
    /**
     * Every outbox entry, oldest first (UUIDv7 keys sort by creation time). A row this version no longer
     * takes as it is comes back refused, with the reason (`keptOutboxEntry`); one whose envelope cannot be
     * read is skipped. None is ever deleted here.
     */
    async listOutbox(): Promise<OutboxEntry[]> {
      const rows = await outbox('readonly', (s) => promisifyRequest(s.getAll()));
      return rows.flatMap((r) => {
        const p = outboxEntrySchema.safeParse(r);
        if (p.success) return [p.data];
        const kept = keptOutboxEntry(r, p.error);
        return kept ? [kept] : [];
      });
    },
    /**
     * Accepted events into the cache and, in the same transaction, their outbox rows out: both or
     * neither. Relaxed durability is enough here: what a power cut loses is only sent again and
     * answered 'duplicate' with its sequence; a tap itself is written 'strict' (putOutbox).
     */
    async storeAccepted(list: readonly StoredEvent[], doneIds: readonly string[]): Promise<void> {
      if (!list.length && !doneIds.length) return;
      const db = await getDb();
      const tx = db.transaction(['events', 'outbox'], 'readwrite', { durability: 'relaxed' });
      const cached = tx.objectStore('events');
      for (const e of list) cached.put(e, [e.caseId, e.seq]);
      const queued = tx.objectStore('outbox');
      for (const id of doneIds) queued.delete(id);
      tx.commit?.();
      await promisifyRequest(tx);
    },
    /** The accepted events of a case held on the tablet, by sequence. */
    listStored: (caseId: string): Promise<StoredEvent[]> =>
      events('readonly', (s) => promisifyRequest(s.getAll(caseRange(caseId)) as IDBRequest<StoredEvent[]>)),
    getMeta: <T>(key: string) => get<T>(key, meta),
    setMeta: (key: string, value: unknown) => set(key, value, meta),
    listAudit: (): Promise<AuditEntry[]> => audit('readonly', (s) => promisifyRequest(s.getAll() as IDBRequest<AuditEntry[]>)),
    /** Close the connection (a "reload" in tests opens a new one over the same database). */
    async close(): Promise<void> {
      const db = await dbp?.catch(() => undefined);
      db?.close();
      dbp = undefined;
      opened = undefined;
    },
  };
}
