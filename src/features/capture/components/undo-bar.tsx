import { useEffect, useState } from 'react';

/** How long after a tap its undo stays offered, ms (a glance and a reach; our choice). */
export const UNDO_WINDOW_MS = 5_000;

/**
 * "Undo" for the last tap, offered for a few seconds. Undo records a `void` with reason "undo"; the
 * event stays in the log, struck through, as every correction does.
 */
export function UndoBar({ label, tappedAt, onUndo, onExpire }: { label: string; tappedAt: number; onUndo: () => void; onExpire: () => void }) {
  const [left, setLeft] = useState(() => Math.ceil((tappedAt + UNDO_WINDOW_MS - Date.now()) / 1000));
  useEffect(() => {
    const tick = () => {
      const ms = tappedAt + UNDO_WINDOW_MS - Date.now();
      if (ms <= 0) onExpire();
      else setLeft(Math.ceil(ms / 1000));
    };
    const t = setInterval(tick, 250);
    const end = setTimeout(onExpire, Math.max(0, tappedAt + UNDO_WINDOW_MS - Date.now()));
    return () => { clearInterval(t); clearTimeout(end); };
  }, [tappedAt, onExpire]);
  return (
    <button
      type="button"
      data-testid="undo"
      onClick={onUndo}
      className="flex min-h-touch-lg w-full items-center justify-between gap-3 rounded-control border-2 border-line-strong bg-sunken px-4 text-left font-bold"
    >
      <span>Undo “{label}”</span>
      <span className="font-mono text-muted tabular-nums" aria-label={`${left} seconds left`}>{left}s</span>
    </button>
  );
}
