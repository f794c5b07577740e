/**
 * The sync engine, framework-free: IndexedDB outbox, socket client, clock sampler, device id.
 * React screens use ./react.ts; everything else imports from here.
 */
export { createSyncEngine, SyncEngine, type SyncEngineOptions, type TapInput } from './engine.ts';
export { createSyncSocket, NoAnswerError, type SyncSocket, type SyncSocketOptions } from './socket-client.ts';
export type { CaseSnapshot, TimelineItem } from './case-view.ts';
export type { SyncStatus, RefusedItem } from './status.ts';
export type { TapState, OutboxEntry, AuditEntry } from './outbox.ts';
export type { ResubmitChanges } from './corrections.ts';
export type { Observable } from './observable.ts';
