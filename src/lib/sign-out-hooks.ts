/**
 * What other parts of the app undo when the user signs out (the sync engine closes its socket, which
 * holds the session), without the sign-out pulling those parts into its own bundle.
 */
const hooks = new Set<() => void>();

/** Run `fn` at every sign-out on this page; returns the unregister. */
export function onSignOut(fn: () => void): () => void {
  hooks.add(fn);
  return () => { hooks.delete(fn); };
}

/** Called by the sign-out itself; a hook that throws does not stop the others. */
export function runSignOutHooks(): void {
  for (const fn of [...hooks]) {
    try { fn(); } catch (err) { console.warn('A sign-out hook failed', err); }
  }
}
