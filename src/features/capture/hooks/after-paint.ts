import { startTransition, useEffect, useState } from 'react';

/**
 * The callbacks waiting for the next paint, run by one animation frame and one task: a tap asks for
 * several (its undo bar, the changes held while its frame is drawn, the strip and the list's last row),
 * and on a slow tablet each requestAnimationFrame call costs a noticeable part of a millisecond.
 */
let waiting: Set<() => void> | null = null;

function onFrame(): void {
  // The batch closes at its frame: a callback asked for from now on waits for the next frame.
  const batch = waiting;
  waiting = null;
  setTimeout(() => { for (const fn of batch ?? []) fn(); }, 0);
}

/**
 * Run `fn` once the next frame has been painted: a task queued from the frame's own animation callback
 * runs after that frame is drawn, behind whatever the browser already had queued. Returns a cancel.
 */
export function afterPaint(fn: () => void): () => void {
  if (typeof requestAnimationFrame !== 'function') {
    const timer = setTimeout(fn, 0);
    return () => clearTimeout(timer);
  }
  // A callback of its own, so that one function asked for twice runs twice and is cancelled once.
  const once = () => fn();
  if (!waiting) {
    waiting = new Set();
    requestAnimationFrame(onFrame);
  }
  const batch = waiting;
  batch.add(once);
  return () => { batch.delete(once); };
}

/**
 * `value` as it stood at the last paint: a change is taken up in a transition after the frame that
 * shows the urgent part of it (the count and the row of a tap), so what is derived from it never holds
 * that frame back. The first render has the value at once.
 */
export function useAfterPaint<T>(value: T): T {
  const [settled, setSettled] = useState(value);
  useEffect(() => {
    if (Object.is(settled, value)) return undefined;
    return afterPaint(() => startTransition(() => setSettled(value)));
  }, [value, settled]);
  return settled;
}
