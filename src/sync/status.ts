import type { NewEvent } from '#shared/schemas/events.ts';
import type { OutboxEntry, TapState } from './outbox.ts';
import type { WriteReceipt } from './storage.ts';

/** A refused event waiting on this tablet for a person to fix or discard it. */
export type RefusedItem = { id: string; event: NewEvent; reason: string };

export type SyncStatus = {
  /** offline: no connection; syncing: connected and sending; online: connected, nothing waiting. */
  state: 'offline' | 'syncing' | 'online';
  connected: boolean;
  /** Events made here and not yet accepted (saving, queued or in flight). Refused ones are not counted. */
  waiting: number;
  refused: readonly RefusedItem[];
  /** The clock estimate stamped on new taps (server minus tablet, ms, ± uncertainty); null if never sampled. */
  clock: { offsetMs: number; uncertaintyMs: number } | null;
  /** The last connection or push problem, in words; cleared at the next connect. */
  lastError: string | null;
  /**
   * The server said this tablet's session has ended (at a handshake, a push or a join, or by closing the
   * socket): taps stay queued here until someone signs in again. Cleared at the next connect.
   */
  sessionEnded: boolean;
  /** The last outbox write: the durability asked of IndexedDB and the time it took to commit. */
  lastWrite: WriteReceipt | null;
};

type Inputs = {
  connected: boolean;
  pushing: boolean;
  entries: readonly (OutboxEntry & { live: TapState })[];
  clock: SyncStatus['clock'];
  lastError: string | null;
  sessionEnded: boolean;
  lastWrite: WriteReceipt | null;
};

export function buildStatus(i: Inputs): SyncStatus {
  const refused = i.entries
    .filter((p) => p.live === 'refused')
    .map((p) => ({ id: p.event.id, event: p.event, reason: p.reason ?? 'Refused' }));
  const waiting = i.entries.length - refused.length;
  const state = !i.connected ? 'offline' : i.pushing || waiting > 0 ? 'syncing' : 'online';
  return { state, connected: i.connected, waiting, refused, clock: i.clock, lastError: i.lastError, sessionEnded: i.sessionEnded, lastWrite: i.lastWrite };
}
