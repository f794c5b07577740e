/**
 * The smallest external store: `subscribe` and `getSnapshot` as React's useSyncExternalStore wants them.
 * The snapshot is rebuilt only after `invalidate()`, so between changes it is the same object.
 */
export function createObservable<T>(build: () => T) {
  const listeners = new Set<() => void>();
  let snapshot: T | undefined;
  return {
    subscribe(listener: () => void): () => void {
      listeners.add(listener);
      return () => { listeners.delete(listener); };
    },
    getSnapshot(): T {
      if (snapshot === undefined) snapshot = build();
      return snapshot;
    },
    /** Mark the snapshot stale and tell every listener at once (synchronously). */
    invalidate(): void {
      snapshot = undefined;
      for (const l of [...listeners]) l();
    },
    get listenerCount(): number { return listeners.size; },
  };
}
export type Observable<T> = ReturnType<typeof createObservable<T>>;
