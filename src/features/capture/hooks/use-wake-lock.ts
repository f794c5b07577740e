import { useEffect, useState } from 'react';

export type WakeLockState = 'held' | 'released' | 'unsupported' | 'refused';

/**
 * Keeps the screen on while the capture screen is open (Screen Wake Lock API, W3C). The browser drops
 * the lock whenever the page is hidden, so it is asked for again on every return to visible.
 */
export function useWakeLock(active = true): WakeLockState {
  const supported = typeof navigator !== 'undefined' && 'wakeLock' in navigator;
  const [state, setState] = useState<WakeLockState>(supported ? 'released' : 'unsupported');

  useEffect(() => {
    if (!active || !supported) return;
    let sentinel: WakeLockSentinel | null = null;
    let stopped = false;
    const acquire = async () => {
      if (document.visibilityState !== 'visible' || (sentinel && !sentinel.released)) return;
      try {
        const s = await navigator.wakeLock.request('screen');
        if (stopped) { void s.release(); return; }
        sentinel = s;
        setState('held');
        s.addEventListener('release', () => { if (!stopped) setState('released'); });
      } catch {
        // Refused (battery saver, no user activation yet, or a permissions policy): the screen still works.
        if (!stopped) setState('refused');
      }
    };
    const onVisibility = () => { if (document.visibilityState === 'visible') void acquire(); };
    void acquire();
    document.addEventListener('visibilitychange', onVisibility);
    // Where a browser wants a user activation first, the first tap is one: ask once more then, and
    // only then (a listener on every tap would cost the tap's own frame).
    window.addEventListener('pointerdown', onVisibility, { passive: true, once: true });
    return () => {
      stopped = true;
      document.removeEventListener('visibilitychange', onVisibility);
      window.removeEventListener('pointerdown', onVisibility);
      void sentinel?.release().catch(() => undefined);
    };
  }, [active, supported]);

  return state;
}
