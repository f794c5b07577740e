import { caseJoinAckSchema, eventsRecordedSchema, isSyncError, okAckSchema, SyncMessages, type SyncError } from '#shared/contracts/sync.ts';
import { statusAfterEvent } from '#shared/domain/case-status.ts';
import type { CaseStatus } from '#shared/schemas/cases.ts';
import type { StoredEvent } from '#shared/schemas/events.ts';
import { buildCaseSnapshot, CaseState, type CaseSnapshot, type TimelineItem } from './case-view.ts';
import { createObservable, type Observable } from './observable.ts';
import type { OutboxEntry, TapState } from './outbox.ts';
import { request, type SyncSocket } from './socket-client.ts';
import type { SyncStorage } from './storage.ts';

/**
 * The status a join answer gives is as of its lastSeq; an event held beyond it (a push's ack or a
 * broadcast that overtook the answer) moves it on, as CaseState.absorb does.
 */
function statusSince(status: CaseStatus, asOfSeq: number, held: Iterable<StoredEvent>): CaseStatus {
  let now = status;
  for (const e of held) if (e.seq > asOfSeq) now = statusAfterEvent(now, e.kind);
  return now;
}

/** In memory, each outbox entry with its live state ('saving' and 'sent' are never stored). */
export type Pending = OutboxEntry & { live: TapState };

type Deps = {
  socket: SyncSocket;
  storage: SyncStorage;
  ackTimeoutMs: number;
  /** The engine's outbox entries: an event accepted by the server leaves it here. */
  entries: Map<string, Pending>;
  changed: (caseId?: string) => void;
  /** A problem in words; `code` when the server answered with an error (an 'unauthorized' ends the session). */
  onError: (message: string, code?: SyncError['code']) => void;
};

/**
 * The cases a tablet shows: their accepted events (kept in IndexedDB too), the room membership, the
 * catch-up after each (re)connect from the highest contiguous sequence held, and the live broadcasts.
 */
export class CaseRegistry {
  private readonly cases = new Map<string, CaseState>();
  private readonly views = new Map<string, Observable<CaseSnapshot>>();
  private readonly joining = new Set<string>();
  /** Joins asked for while one was in flight: run once more when it ends. */
  private readonly rejoin = new Set<string>();

  constructor(private readonly d: Deps) {}

  state(caseId: string): CaseState {
    let c = this.cases.get(caseId);
    if (!c) { c = new CaseState(caseId); this.cases.set(caseId, c); }
    return c;
  }

  view(caseId: string): Observable<CaseSnapshot> {
    let v = this.views.get(caseId);
    if (!v) {
      v = createObservable(() => buildCaseSnapshot(this.state(caseId), this.pendingOf(caseId)));
      this.views.set(caseId, v);
    }
    return v;
  }

  invalidate(caseId?: string): void {
    if (caseId) this.views.get(caseId)?.invalidate();
    else for (const v of this.views.values()) v.invalidate();
  }

  /** First viewer of a case: read what the tablet holds; returns true when the room should be joined now. */
  async open(caseId: string): Promise<boolean> {
    const c = this.state(caseId);
    if (++c.refs > 1) return false;
    if (!c.loaded) {
      c.absorb(await this.d.storage.listStored(caseId));
      c.loaded = true;
      this.d.changed(caseId);
    }
    return true;
  }

  /**
   * Last viewer gone: leave the room, and let the case go from memory (the events stay in IndexedDB; a
   * later open reads them back and catches up). A tablet left on all day opens case after case.
   */
  close(caseId: string): void {
    const c = this.cases.get(caseId);
    if (!c || c.refs === 0) return;
    if (--c.refs > 0) return;
    if (this.d.socket.connected) {
      request(this.d.socket, SyncMessages.caseLeave, { caseId }, okAckSchema, this.d.ackTimeoutMs).catch(() => undefined);
    }
    // After the task: a screen unsubscribes from the view just after it closes the case.
    setTimeout(() => this.release(caseId), 0);
  }

  /** The case ids held in memory now. */
  held(): string[] { return [...this.cases.keys()]; }

  /**
   * Drop a case nobody shows from memory: no viewer, no join running, no one listening to its view.
   * The view object itself stays (a screen may hold it from its render); its snapshot is let go and is
   * rebuilt from a fresh, unloaded state when next read.
   */
  private release(caseId: string): void {
    const c = this.cases.get(caseId);
    if (!c || c.refs > 0 || this.joining.has(caseId) || (this.views.get(caseId)?.listenerCount ?? 0) > 0) return;
    this.cases.delete(caseId);
    this.views.get(caseId)?.invalidate();
  }

  /** Join every case that has a viewer (after a connect). */
  joinOpen(): void {
    for (const c of this.cases.values()) if (c.refs > 0) void this.join(c.caseId);
  }

  /** Join a case's room and read every page after the contiguous sequence held. */
  async join(caseId: string): Promise<void> {
    // Closed again before its join began (a screen opened and left at once): no room to hear.
    if ((this.cases.get(caseId)?.refs ?? 0) === 0) return;
    if (this.joining.has(caseId)) { this.rejoin.add(caseId); return; }
    this.joining.add(caseId);
    const c = this.state(caseId);
    try {
      for (;;) {
        const ack = await request(this.d.socket, SyncMessages.caseJoin, { caseId, afterSeq: c.contiguousSeq }, caseJoinAckSchema, this.d.ackTimeoutMs);
        if (isSyncError(ack)) {
          c.error = ack.error;
          if (ack.code === 'unauthorized') this.d.onError(ack.error, ack.code);
          this.d.changed(caseId);
          return;
        }
        c.error = null;
        c.status = statusSince(ack.status, ack.lastSeq, c.stored.values());
        await this.accept(caseId, ack.events);
        c.lastSeq = Math.max(c.lastSeq, ack.lastSeq);
        this.d.changed(caseId);
        if (!ack.hasMore || ack.events.length === 0) return;
      }
    } catch (err) {
      this.d.onError((err as Error).message); // unanswered: the next connect joins again
    } finally {
      this.joining.delete(caseId);
      if (this.rejoin.delete(caseId) && c.refs > 0 && this.d.socket.connected) void this.join(caseId);
      else this.release(caseId);
    }
  }

  /** `events.recorded` from the room; a gap in the sequence (a missed broadcast) is filled by a join. */
  onRecorded(msg: unknown): void {
    const parsed = eventsRecordedSchema.safeParse(msg);
    if (!parsed.success) return;
    const c = this.state(parsed.data.caseId);
    this.accept(c.caseId, parsed.data.events).then(() => {
      if (c.hasGap && c.refs > 0 && this.d.socket.connected) void this.join(c.caseId);
    }, (err: unknown) => this.d.onError((err as Error).message));
  }

  /** Take accepted events into the case and the IndexedDB cache; their outbox entries are done. */
  async accept(caseId: string, events: readonly StoredEvent[]): Promise<void> {
    const added = this.state(caseId).absorb(events);
    // Every held event settles its outbox entry, also one the case already held (read from the cache).
    const done = events.filter((e) => e.caseId === caseId && this.d.entries.delete(e.id)).map((e) => e.id);
    if (!added.length && !done.length) return;
    this.d.changed(caseId);
    // One transaction: the cache rows and the outbox removals land together, or neither does (then the
    // events are sent again and answered 'duplicate': never lost).
    await this.d.storage.storeAccepted(added, done);
  }

  private pendingOf(caseId: string): TimelineItem[] {
    const mine: Pending[] = [];
    let sorted = true;
    // The outbox map holds its entries in the order they were made (UUIDv7 ids): sorted only when not.
    for (const p of this.d.entries.values()) {
      if (p.event.caseId !== caseId) continue;
      if (mine.length && mine[mine.length - 1]!.event.id > p.event.id) sorted = false;
      mine.push(p);
    }
    if (!sorted) mine.sort((a, b) => (a.event.id < b.event.id ? -1 : 1));
    return mine.map((p) => ({ id: p.event.id, event: p.event, state: p.live, seq: null, receivedAt: null, reason: p.reason }));
  }
}
