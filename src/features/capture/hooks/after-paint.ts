import { startTransition, useEffect, useState } from 'react';

/**
 * Run `fn` once the next frame has been painted: a task queued from the frame's own animation callback
 * runs after that frame is drawn, behind whatever the browser already had queued. Returns a cancel.
 */
export function afterPaint(fn: () => void): () => void {
  let timer: ReturnType<typeof setTimeout> | undefined;
  if (typeof requestAnimationFrame !== 'function') {
    timer = setTimeout(fn, 0);
    return () => clearTimeout(timer);
  }
  const frame = requestAnimationFrame(() => { timer = setTimeout(fn, 0); });
  return () => { cancelAnimationFrame(frame); clearTimeout(timer); };
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
