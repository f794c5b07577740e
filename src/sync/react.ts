import { createContext, createElement, useCallback, useContext, useEffect, useMemo, useSyncExternalStore, type ReactNode } from 'react';
import type { EventKind, NewEventOf } from '#shared/schemas/events.ts';
import type { CaseSnapshot } from './case-view.ts';
import type { SyncEngine, TapInput } from './engine.ts';
import type { SyncStatus } from './status.ts';

/**
 * The one bridge from the sync engine to React (the only file of src/sync that imports react). The app
 * creates one engine after sign-in and puts it in <SyncProvider>; screens use the hooks below.
 */
const SyncContext = createContext<SyncEngine | null>(null);

export function SyncProvider({ engine, children }: { engine: SyncEngine; children?: ReactNode }) {
  return createElement(SyncContext.Provider, { value: engine }, children);
}

export function useSyncEngine(): SyncEngine {
  const engine = useContext(SyncContext);
  if (!engine) throw new Error('useSyncEngine needs a <SyncProvider> above it');
  return engine;
}

/** The timeline of a case as this tablet holds it; opens the case (and its room) while mounted. */
export function useCaseEvents(caseId: string): CaseSnapshot {
  const engine = useSyncEngine();
  const view = engine.caseView(caseId);
  useEffect(() => {
    // A refused join shows in the snapshot (`error`); an unreadable IndexedDB leaves it `loaded: false`.
    engine.openCase(caseId).catch(() => undefined);
    return () => engine.closeCase(caseId);
  }, [engine, caseId]);
  return useSyncExternalStore(view.subscribe, view.getSnapshot, view.getSnapshot);
}

/** Connection, waiting count, refused list and clock estimate. */
export function useSyncStatus(): SyncStatus {
  const engine = useSyncEngine();
  return useSyncExternalStore(engine.status.subscribe, engine.status.getSnapshot, engine.status.getSnapshot);
}

/**
 * A part of the sync status, re-rendering its user only when that part changed (`same` says when it did
 * not): the status is rebuilt on every step of every tap (saving, queued, sent, accepted), and most
 * of those steps change nothing a given part shows. `select` and `same` should keep one identity.
 */
export function useSyncStatusPart<T>(select: (s: SyncStatus) => T, same: (a: T, b: T) => boolean): T {
  const engine = useSyncEngine();
  const getPart = useMemo(() => {
    let last: { status: SyncStatus; part: T } | null = null;
    return () => {
      const status = engine.status.getSnapshot();
      if (last?.status === status) return last.part;
      const part = select(status);
      last = { status, part: last && same(last.part, part) ? last.part : part };
      return last.part;
    };
  }, [engine, select, same]);
  return useSyncExternalStore(engine.status.subscribe, getPart, getPart);
}

/**
 * A function that records a tap: it shows at once in useCaseEvents (state 'saving') and resolves after
 * the event is written to IndexedDB; it rejects (and the tap is taken off the screen) if it was not.
 */
export function useRecordTap(): <K extends EventKind>(input: TapInput<K>) => Promise<NewEventOf<K>> {
  const engine = useSyncEngine();
  return useCallback(<K extends EventKind>(input: TapInput<K>) => engine.recordTap(input), [engine]);
}
