import { useEffect, useState } from 'react';

/**
 * The current time, refreshed every `everyMs`, aligned to the wall-clock second so two clocks on the
 * screen tick together. Only the small component that shows a running time uses it, so the rest of the
 * screen does not re-render every second.
 */
export function useNow(everyMs = 1000, active = true): number {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    if (!active) return;
    let timer: ReturnType<typeof setTimeout>;
    const tick = () => {
      const t = Date.now();
      setNow(t);
      timer = setTimeout(tick, everyMs - (t % everyMs) + 5);
    };
    timer = setTimeout(tick, everyMs - (Date.now() % everyMs) + 5);
    return () => clearTimeout(timer);
  }, [everyMs, active]);
  return now;
}

/** Elapsed time as h:mm:ss (or m:ss under an hour); negative spans read 0:00. */
export function formatElapsed(ms: number): string {
  const total = Math.max(0, Math.floor(ms / 1000));
  const h = Math.floor(total / 3600);
  const m = Math.floor((total % 3600) / 60);
  const s = total % 60;
  const ss = String(s).padStart(2, '0');
  return h > 0 ? `${h}:${String(m).padStart(2, '0')}:${ss}` : `${m}:${ss}`;
}

/** Clock time of day, 24 h, with seconds (the room's wall clock reads the same way). */
export function formatClock(ms: number): string {
  const d = new Date(ms);
  return [d.getHours(), d.getMinutes(), d.getSeconds()].map((n) => String(n).padStart(2, '0')).join(':');
}
