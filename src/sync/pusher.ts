import {
  eventsPushAckSchema, isSyncError, jsonBytes, MAX_PUSH_BYTES, SyncMessages, type PushResult, type SyncError,
} from '#shared/contracts/sync.ts';
import type { StoredEvent } from '#shared/schemas/events.ts';
import type { CaseRegistry, Pending } from './cases.ts';
import { request, type SyncSocket } from './socket-client.ts';
import type { SyncStorage } from './storage.ts';

type Deps = {
  socket: SyncSocket;
  storage: SyncStorage;
  entries: Map<string, Pending>;
  cases: CaseRegistry;
  ackTimeoutMs: number;
  batchSize: number;
  retryDelaysMs: readonly number[];
  changed: (caseId?: string) => void;
  /** A problem in words; `code` when the server answered with an error (an 'unauthorized' ends the session). */
  onError: (message: string, code?: SyncError['code']) => void;
};

/** Whole-push errors after which the same push would fail again: its events are refused for a person to see. */
const permanent: ReadonlySet<SyncError['code']> = new Set(['bad_request', 'forbidden', 'not_found']);

/** Oldest first: UUIDv7 ids sort by the time they were made. */
const byId = (a: Pending, b: Pending) => (a.event.id < b.event.id ? -1 : 1);

/**
 * Pushes the outbox: batches of one case, oldest first, each with an ack timeout; anything unanswered
 * is sent again after a back-off and at every connect (at-least-once; the server stores each id once).
 * An 'unauthorized' or 'internal' answer is a passing state (retried); a refusal is for a person.
 */
export class Pusher {
  pushing = false;
  /** A pump was asked for while this one was running. */
  private again = false;
  private failures = 0;
  private batchSize: number;
  private timer: ReturnType<typeof setTimeout> | undefined;
  private stopped = false;
  private readonly writes: Promise<void>[] = [];

  constructor(private readonly d: Deps) {
    this.batchSize = d.batchSize;
  }

  connected(): void {
    this.failures = 0;
    void this.pump();
  }

  stop(): void {
    this.stopped = true;
    if (this.timer) clearTimeout(this.timer);
  }

  async pump(): Promise<void> {
    if (this.stopped) return;
    // Asked while pushing (a tap's write committed, a reconnect): this pump goes round once more before
    // it ends. Dropping the ask left a tap queued, unsent, until something else pumped.
    if (this.pushing) { this.again = true; return; }
    this.pushing = true;
    try {
      // A case whose push failed waits for the back-off; the other cases' taps still go now, also those
      // tapped while this pump runs.
      const failing = new Set<string>();
      do {
        this.again = false;
        for (let batch = this.nextBatch(failing); batch.length && this.d.socket.connected; batch = this.nextBatch(failing)) {
          if (!(await this.push(batch))) failing.add(batch[0]!.event.caseId);
        }
        await Promise.all(this.writes.splice(0));
      } while (this.again && !this.stopped);
      if (failing.size) this.retryLater(); else this.failures = 0;
    } catch (err) {
      // An IndexedDB failure while applying answers: what is not settled goes back to the queue.
      this.d.onError((err as Error).message);
      for (const p of this.d.entries.values()) if (p.live === 'sent') p.live = 'queued';
      this.retryLater();
    } finally {
      this.pushing = false;
      this.d.changed();
    }
  }

  /** The oldest queued events of one case, within the count and size limits of one push. */
  private nextBatch(skip: ReadonlySet<string>): Pending[] {
    const queued = [...this.d.entries.values()].filter((p) => p.live === 'queued' && !skip.has(p.event.caseId)).sort(byId);
    const caseId = queued[0]?.event.caseId;
    const batch: Pending[] = [];
    let bytes = 256; // the envelope of the message
    for (const p of queued) {
      if (p.event.caseId !== caseId) continue;
      bytes += jsonBytes(p.event) + 1;
      if (batch.length >= this.batchSize || (batch.length > 0 && bytes > MAX_PUSH_BYTES)) break;
      batch.push(p);
    }
    return batch;
  }

  /** One push and its answer; false when it has to be tried again later. */
  private async push(batch: Pending[]): Promise<boolean> {
    const caseId = batch[0]!.event.caseId;
    for (const p of batch) { p.live = 'sent'; p.attempts++; }
    // The message leaves within this call; the screen is told after (its snapshot is rebuilt at once).
    const answer = request(this.d.socket, SyncMessages.eventsPush, { caseId, events: batch.map((p) => p.event) }, eventsPushAckSchema, this.d.ackTimeoutMs);
    this.d.changed(caseId);
    let ack;
    try {
      ack = await answer;
    } catch (err) {
      this.d.onError((err as Error).message);
      this.requeue(batch);
      return false;
    }
    if (!isSyncError(ack)) {
      await this.apply(caseId, batch, ack.results);
      return true;
    }
    this.d.onError(ack.error, ack.code);
    if (ack.code === 'too_large' && batch.length > 1) {
      this.batchSize = Math.max(1, Math.floor(batch.length / 2)); // send it in halves
      this.requeue(batch);
      return true;
    }
    if (!permanent.has(ack.code) && ack.code !== 'too_large') { this.requeue(batch); return false; }
    await Promise.all(batch.map((p) => this.refuse(p, ack.error)));
    return true;
  }

  private async apply(caseId: string, batch: Pending[], results: PushResult[]): Promise<void> {
    const stored: StoredEvent[] = [];
    const refusals: Promise<void>[] = [];
    batch.forEach((p, i) => {
      const r = results[i];
      if (!r || r.id !== p.event.id) { if (p.live === 'sent') p.live = 'queued'; return; } // no answer for it: send again
      if (r.status === 'refused') refusals.push(this.refuse(p, r.reason));
      else stored.push({ ...p.event, seq: r.seq, receivedAt: r.receivedAt } as StoredEvent);
    });
    await Promise.all(refusals);
    // The accepted events leave the outbox in memory at once; their IndexedDB writes go on while the
    // next push travels (awaited before the pump ends; a failed write only means a resend, answered
    // 'duplicate').
    const written = this.d.cases.accept(caseId, stored);
    written.catch(() => undefined); // seen by the pump's Promise.all; not an unhandled rejection meanwhile
    this.writes.push(written);
  }

  private async refuse(p: Pending, reason: string): Promise<void> {
    p.live = 'refused';
    p.state = 'refused';
    p.reason = reason;
    await this.d.storage.putOutbox({ event: p.event, state: 'refused', reason, attempts: p.attempts, discardOf: p.discardOf });
    this.d.changed(p.event.caseId);
  }

  private requeue(batch: Pending[]): void {
    for (const p of batch) if (p.live === 'sent') p.live = 'queued';
    this.d.changed(batch[0]?.event.caseId);
  }

  private retryLater(): void {
    if (this.timer || this.stopped) return;
    const delays = this.d.retryDelaysMs;
    const delay = delays[Math.min(this.failures, delays.length - 1)] ?? 1_000;
    this.failures++;
    this.timer = setTimeout(() => { this.timer = undefined; void this.pump(); }, delay);
  }
}
