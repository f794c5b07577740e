import { startTransition, useEffect, useReducer } from 'react';
import type { CaseSnapshot } from '@/sync/index.ts';
import { useSyncEngine } from '@/sync/react.ts';
import { afterPaint } from './after-paint.ts';

/**
 * The case as this tablet holds it, like the bridge's useCaseEvents, with one difference in timing: a
 * change made inside the tap itself (the event shown as 'saving') is drawn at once, in the tap's own
 * frame, while the changes that follow it (saved, sent, accepted, another tablet's taps) are drawn as
 * transitions that yield to the browser, at most one per BURST_GAP_MS, and none before the frame that
 * shows the tap has been painted, so they never hold it back. (useSyncExternalStore renders every change
 * synchronously, whatever caused it.)
 */
export function useCaseSnapshot(caseId: string): CaseSnapshot {
  const engine = useSyncEngine();
  const view = engine.caseView(caseId);
  // The snapshot is read when rendering, not at each change: a burst of changes (a queue being sent)
  // is drawn once, and the engine builds its snapshot once for it.
  const [, redraw] = useReducer((n: number) => n + 1, 0);

  useEffect(() => {
    let last = -Infinity;
    let timer: ReturnType<typeof setTimeout> | undefined;
    // Set from a tap until its frame is on screen: what changes meanwhile (its write committed, its push
    // sent and answered) waits for that paint.
    let tapFrame: (() => void) | null = null;
    let held = false;
    const now = () => performance.now();
    const later = () => { timer = undefined; last = now(); startTransition(redraw); };
    const update = () => {
      // Inside a pointer or key event React gives the update the event's (discrete) priority: drawn now.
      if (isDiscreteEvent()) {
        last = now();
        redraw();
        tapFrame ??= afterPaint(() => { tapFrame = null; if (held) { held = false; update(); } });
        return;
      }
      if (tapFrame) { held = true; return; }
      // Otherwise at most one redraw per BURST_GAP_MS: the first change after a quiet spell (another
      // tablet's tap) is drawn at once, a burst (a queue being acknowledged) in steps.
      if (timer) return;
      const wait = last + BURST_GAP_MS - now();
      if (wait <= 0) later();
      else timer = setTimeout(later, wait);
    };
    const unsubscribe = view.subscribe(update);
    update(); // what changed between the first render and this subscription
    engine.openCase(caseId).catch(() => undefined); // a refused join shows in the snapshot's `error`
    return () => {
      unsubscribe();
      if (timer) clearTimeout(timer);
      tapFrame?.();
      engine.closeCase(caseId);
    };
  }, [engine, view, caseId]);

  return view.getSnapshot();
}

/** Shortest pause between two redraws not caused by a touch or a key, ms (our choice: 10 a second). */
export const BURST_GAP_MS = 100;

const discrete = new Set(['pointerdown', 'pointerup', 'click', 'keydown', 'keyup', 'touchstart', 'touchend', 'input', 'change']);
function isDiscreteEvent(): boolean {
  const e = typeof window === 'undefined' ? undefined : window.event;
  return Boolean(e && discrete.has(e.type));
}
