import { v7 as uuidv7 } from 'uuid';
import { clockPingAckSchema, isSyncError, MAX_BATCH_EVENTS, SyncMessages, type SyncError } from '#shared/contracts/sync.ts';
import { newEventSchema, type EventKind, type NewEvent, type NewEventOf, type PayloadOf } from '#shared/schemas/events.ts';
import type { CaseSnapshot } from './case-view.ts';
import { CaseRegistry, type Pending } from './cases.ts';
import { createClockSampler } from './clock-sampler.ts';
import { discardRemarkText, rebuildEvent, type ResubmitChanges } from './corrections.ts';
import { loadDeviceId } from './device-id.ts';
import { createObservable, type Observable } from './observable.ts';
import { newOutboxEntry } from './outbox.ts';
import { Pusher } from './pusher.ts';
import { request, type SyncSocket } from './socket-client.ts';
import { buildStatus, type SyncStatus } from './status.ts';
import { openSyncStorage, type Settlement, type WriteReceipt } from './storage.ts';

export type SyncEngineOptions = {
  socket: SyncSocket;
  /** The signed-in user's id: the author of what is tapped on this tablet. */
  author: string;
  /** IndexedDB database name (tests give each "tablet" its own). */
  dbName?: string;
  /** The tablet clock, ms since the epoch (also what deviceTime is read from). */
  now?: () => number;
  /** Most events per push (at most MAX_BATCH_EVENTS). */
  batchSize?: number;
  ackTimeoutMs?: number;
  /** Waits between failed pushes, the last one repeating. */
  retryDelaysMs?: readonly number[];
  clock?: { burst?: number; intervalMs?: number };
};

/** The User Timing mark made when a tap's IndexedDB write has committed (its detail names the event). */
export const TAP_DURABLE_MARK = 'sync:tap-durable';

export type TapInput<K extends EventKind> = { caseId: string; kind: K; payload: PayloadOf<K> };

/**
 * The tablet's sync engine, framework-free. A tap is written to the IndexedDB outbox before it counts as
 * taken, pushed at least once until the server answers for it, and kept with its reason if refused.
 * Accepted events of the cases on screen are held in memory and in IndexedDB; each (re)connect sends
 * what is queued and catches up from the last sequence held. React reaches it through ./react.ts.
 */
export class SyncEngine {
  private readonly socket: SyncSocket;
  private readonly storage;
  private readonly now: () => number;
  private author: string;
  private device = '';
  private readonly entries = new Map<string, Pending>();
  private readonly cases: CaseRegistry;
  private readonly pusher: Pusher;
  private readonly sampler;
  private clock: SyncStatus['clock'] = null;
  private lastError: string | null = null;
  private sessionEnded = false;
  private lastWrite: WriteReceipt | null = null;
  private stopped = false;
  /** Closed at a sign-out, until the next sign-in. */
  private signedOutSocket = false;
  /** Refused events a person is fixing or discarding right now (one decision each). */
  private readonly settling = new Set<string>();
  readonly ready: Promise<void>;
  readonly status: Observable<SyncStatus>;

  constructor(opts: SyncEngineOptions) {
    this.socket = opts.socket;
    this.author = opts.author;
    this.now = opts.now ?? (() => Date.now());
    this.storage = openSyncStorage(opts.dbName);
    const ackTimeoutMs = opts.ackTimeoutMs ?? 10_000;
    const onError = (message: string, code?: SyncError['code']) => {
      this.lastError = message;
      if (code === 'unauthorized') this.sessionHasEnded();
      this.changed();
    };
    this.cases = new CaseRegistry({ socket: this.socket, storage: this.storage, ackTimeoutMs, entries: this.entries, changed: (id) => this.changed(id), onError });
    this.pusher = new Pusher({
      socket: this.socket, storage: this.storage, entries: this.entries, cases: this.cases, ackTimeoutMs, onError,
      changed: (id) => this.changed(id),
      batchSize: Math.min(opts.batchSize ?? 100, MAX_BATCH_EVENTS),
      retryDelaysMs: opts.retryDelaysMs ?? [1_000, 2_000, 5_000, 10_000, 30_000],
    });
    this.status = createObservable(() => buildStatus({
      connected: this.socket.connected, pushing: this.pusher.pushing, entries: [...this.entries.values()],
      clock: this.clock, lastError: this.lastError, sessionEnded: this.sessionEnded, lastWrite: this.lastWrite,
    }));
    this.sampler = createClockSampler({
      ...opts.clock,
      now: this.now,
      ping: async (t1) => {
        const a = await request(this.socket, SyncMessages.clockPing, { t1 }, clockPingAckSchema, ackTimeoutMs);
        if (isSyncError(a)) throw new Error(a.error);
        return a;
      },
      onEstimate: (e) => {
        this.clock = { offsetMs: e.offsetMs, uncertaintyMs: e.uncertaintyMs };
        this.storage.setMeta('clock', this.clock).catch(() => undefined); // only a hint for the next offline start
        this.changed();
      },
    });
    this.ready = this.load();
  }

  /** Read the device id, the outbox and the last clock estimate from IndexedDB, then connect. */
  private async load(): Promise<void> {
    this.device = await loadDeviceId(this.storage);
    const clock = await this.storage.getMeta<{ offsetMs: number; uncertaintyMs: number }>('clock');
    if (clock && Number.isFinite(clock.offsetMs)) this.clock = clock;
    for (const e of await this.storage.listOutbox()) this.entries.set(e.event.id, { ...e, live: e.state });
    const s = this.socket;
    s.on('connect', () => {
      this.lastError = null;
      this.sessionEnded = false;
      this.changed();
      void this.sampler.start();
      this.cases.joinOpen();
      this.pusher.connected();
    });
    s.on('disconnect', (reason) => {
      this.sampler.stop();
      // The server closes a socket whose session ended (server/realtime/rights.ts); Socket.IO does not
      // reconnect after that, and the next sign-in, even of the same user, must.
      if (reason === 'io server disconnect' && !this.stopped) {
        this.sessionHasEnded();
        this.lastError = 'The server ended this connection: your session has ended; sign in again';
      }
      this.changed();
    });
    s.on('connect_error', (err) => {
      this.lastError = err.message;
      // The handshake was refused for want of a session (server/realtime/session.ts), not for the network.
      if ((err as { data?: { code?: unknown } }).data?.code === 'unauthorized') this.sessionHasEnded();
      this.changed();
    });
    s.on(SyncMessages.eventsRecorded, (msg) => this.cases.onRecorded(msg));
    this.changed();
    if (!this.stopped) s.connect();
  }

  /**
   * The server said this tablet's session has ended: the screen says so, and since the socket holds
   * that session (and Socket.IO retries neither a refusal nor a server's disconnect), the next sign-in,
   * even of the same user, makes a new handshake.
   */
  private sessionHasEnded(): void {
    this.sessionEnded = true;
    this.signedOutSocket = true;
  }

  get deviceId(): string { return this.device; }
  /**
   * Another user signed in on this page: their taps carry their id, and the socket connects again, since
   * a socket keeps the session of its handshake (the last user's, ended by their sign-out).
   */
  setAuthor(userId: string): void {
    if (userId === this.author && !this.signedOutSocket) return;
    this.signedOutSocket = false;
    this.author = userId;
    this.reconnect();
  }

  /**
   * The user signed out: the socket is closed, since it holds their session (it would go on hearing the
   * case's room); what is queued stays queued, sent after the next sign-in (`setAuthor`).
   */
  signedOut(): void {
    this.signedOutSocket = true;
    this.socket.disconnect();
  }

  /**
   * A new handshake, with the session signed in now: after the server refused one (no session yet, or it
   * ended; Socket.IO does not retry a refusal by itself), or after another sign-in, when a connected
   * socket still holds the last user's session. Pushes in flight are sent again (answered 'duplicate').
   */
  reconnect(): void {
    if (this.stopped) return;
    if (this.socket.connected) this.socket.disconnect();
    this.socket.connect();
  }

  /**
   * Record a tap: the event is built (UUIDv7, device time now, current offset and uncertainty) and shown
   * to subscribers as 'saving' within this call; the promise resolves once the outbox write committed
   * in IndexedDB. It rejects, and the tap leaves the screen, when the input is invalid or the write failed.
   */
  recordTap<K extends EventKind>(input: TapInput<K>): Promise<NewEventOf<K>> {
    return this.tap(input, null);
  }

  /** `settles`: the refused event this tap decides about (a discard's remark), written with it. */
  private tap<K extends EventKind>(input: TapInput<K>, discardOf: string | null, settles?: (event: NewEvent) => Settlement): Promise<NewEventOf<K>> {
    if (!this.device) return this.ready.then(() => this.tap(input, discardOf, settles));
    let event: NewEvent;
    try {
      event = newEventSchema.parse({
        id: uuidv7(), caseId: input.caseId, kind: input.kind, payload: input.payload,
        deviceTime: new Date(this.now()).toISOString(),
        offsetMs: this.clock?.offsetMs ?? 0, offsetUncertaintyMs: this.clock?.uncertaintyMs ?? null,
        author: this.author, device: this.device,
      }) as NewEvent;
    } catch (err) {
      return Promise.reject(err);
    }
    return this.enqueue(event, discardOf, settles?.(event)).then(() => event as NewEventOf<K>);
  }

  private enqueue(event: NewEvent, discardOf: string | null = null, settles?: Settlement): Promise<void> {
    const entry = newOutboxEntry(event, discardOf);
    // The write is started first (synchronously, when the database is open), then the tap is shown: the
    // disk works while the screen draws the tap.
    const written = this.storage.putOutbox(entry, settles);
    this.entries.set(event.id, { ...entry, live: 'saving' });
    this.changed(event.caseId);
    return written.then((receipt) => {
      // The first thing done once the write is committed: a User Timing mark (DevTools, `npm run bench`).
      performance.mark(TAP_DURABLE_MARK, { detail: { eventId: event.id, ms: receipt.ms } });
      this.lastWrite = receipt;
      const p = this.entries.get(event.id);
      if (p?.live === 'saving') p.live = 'queued';
      if (settles) this.entries.delete(settles.drop);
      // Only now: nothing is sent before its IndexedDB write committed. Sent first, then drawn: telling
      // the screen rebuilds its snapshot at once, and the push need not wait for that.
      void this.pusher.pump();
      this.changed(event.caseId);
    }, (err: unknown) => {
      this.entries.delete(event.id);
      this.changed(event.caseId);
      throw err;
    });
  }

  /**
   * Discard a refused event. Recorded twice: as a `remark` event in the case (synced like any tap, so the
   * record itself says what was discarded and why) and as an audit entry kept on the tablet. Discarding
   * the remark of an earlier discard (refused too, say in a closed case) writes only the audit entry.
   */
  async discardRefused(id: string, why: string): Promise<void> {
    const p = this.refusedEntry(id);
    try {
      const decided = (recordedAs: string | null): Settlement => ({
        audit: { action: 'discarded', event: p.event, reason: p.reason, by: this.author, at: new Date(this.now()).toISOString(), why, recordedAs },
        drop: id,
      });
      if (p.discardOf) {
        await this.storage.settleRefused(decided(null));
        this.entries.delete(id);
        this.changed(p.event.caseId);
      } else {
        await this.tap({ caseId: p.event.caseId, kind: 'remark', payload: { text: discardRemarkText(p.event, p.reason, why) } }, id, (remark) => decided(remark.id));
      }
    } finally { this.settling.delete(id); }
  }

  /** Fix a refused event: send it again as a new event (new id) with the changes; the old one is dropped and audited. */
  async resubmitRefused(id: string, changes: ResubmitChanges, why = 'Corrected and sent again'): Promise<NewEvent> {
    const p = this.refusedEntry(id);
    try {
      const event = rebuildEvent(p.event, changes, { id: uuidv7(), author: this.author });
      await this.enqueue(event, null, {
        audit: { action: 'replaced', event: p.event, reason: p.reason, by: this.author, at: new Date(this.now()).toISOString(), why, recordedAs: event.id },
        drop: id,
      });
      return event;
    } finally { this.settling.delete(id); }
  }

  private refusedEntry(id: string): Pending {
    const p = this.entries.get(id);
    if (!p || p.live !== 'refused') throw new Error(`No refused event ${id} on this tablet`);
    if (this.settling.has(id)) throw new Error(`The refused event ${id} is already being fixed or discarded`);
    this.settling.add(id);
    return p;
  }

  /** The tablet's own audit of discarded and replaced events. */
  listAudit() { return this.storage.listAudit(); }

  /** Show a case: read its events kept on the tablet, then join its room (now, and after every reconnect). */
  async openCase(caseId: string): Promise<void> {
    if (!(await this.cases.open(caseId))) return;
    await this.ready;
    if (this.socket.connected) await this.cases.join(caseId);
  }

  /** Stop showing a case (the last viewer left): leave its room; what is held stays in IndexedDB. */
  closeCase(caseId: string): void { this.cases.close(caseId); }

  /** The cases held in memory now (those shown, and for a moment those just closed). */
  casesInMemory(): string[] { return this.cases.held(); }

  /** The case's timeline as a subscribe/getSnapshot store. */
  caseView(caseId: string): Observable<CaseSnapshot> { return this.cases.view(caseId); }

  /** Push what is queued now (the screen may offer "send now"; it also runs after each tap and connect). */
  pump(): Promise<void> { return this.pusher.pump(); }

  private changed(caseId?: string): void {
    this.status.invalidate();
    this.cases.invalidate(caseId);
  }

  /** Disconnect and close IndexedDB; what is queued stays queued for the next start. */
  async stop(): Promise<void> {
    this.stopped = true;
    this.pusher.stop();
    await this.ready.catch(() => undefined);
    this.sampler.stop();
    this.socket.removeAllListeners();
    this.socket.disconnect();
    await this.storage.close();
  }
}

export function createSyncEngine(opts: SyncEngineOptions): SyncEngine {
  return new SyncEngine(opts);
}
