import { memo } from 'react';
import { cn } from '@/lib/cn.ts';
import { formatClock, formatElapsed } from '../hooks/use-now.ts';
import type { RecentRow } from '../rows.ts';

type Props = {
  rows: RecentRow[];
  /** Case clock origin (corrected ms), for the "+12:04" beside each time; null before the first event. */
  originMs: number | null;
  onOpen: (id: string) => void;
};

const stateWords: Record<RecentRow['state'], string> = {
  saving: 'Saving on this tablet',
  queued: 'Saved on this tablet, waiting to send',
  sent: 'Sending',
  accepted: 'In the record',
  refused: 'Refused by the server',
};
const stateMarks: Record<RecentRow['state'], string> = { saving: '…', queued: '◷', sent: '↑', accepted: '✓', refused: '!' };

/**
 * The most recent events, newest first. Tapping a row opens it to add details, correct it or void it.
 * Only the newest rows are drawn (the full log is on the record page): a long case keeps the tap fast.
 */
export const RecentList = memo(function RecentList({ rows, originMs, onOpen }: Props) {
  if (!rows.length) return <p className="px-1 py-4 text-muted">No events yet. Tap a button to record one.</p>;
  return (
    <ol className="flex flex-col gap-1.5" aria-label="Recent events, newest first" data-testid="recent-events">
      {rows.map((row) => <Row key={row.id} row={row} originMs={originMs} onOpen={onOpen} />)}
    </ol>
  );
});

type RowProps = { row: RecentRow; originMs: number | null; onOpen: (id: string) => void };

/** A row re-renders only when what it shows changed (rows are rebuilt on every sync-state change). */
const sameRow = (a: RowProps, b: RowProps) => a.originMs === b.originMs && a.onOpen === b.onOpen && (a.row === b.row || (
  a.row.id === b.row.id && a.row.label === b.row.label && a.row.detail === b.row.detail && a.row.timeMs === b.row.timeMs
  && a.row.state === b.row.state && a.row.mine === b.row.mine && a.row.authorLabel === b.row.authorLabel
  && a.row.voided === b.row.voided && a.row.voidReason === b.row.voidReason && a.row.amended === b.row.amended));

const Row = memo(function Row({ row, originMs, onOpen }: RowProps) {
  return (
    <li data-event-id={row.id} data-kind={row.kind} data-voided={row.voided || undefined} className="contain-content">
      <button
        type="button"
        onClick={() => onOpen(row.id)}
        className={cn(
          'grid min-h-touch w-full grid-cols-[4.6rem_1fr_auto] items-center gap-2 rounded-control border-2 px-2 py-1 text-left',
          row.state === 'refused' ? 'border-danger bg-danger-soft' : 'border-line bg-surface',
        )}
      >
        <span className="font-mono text-sm leading-tight tabular-nums">
          {formatClock(row.timeMs)}
          {originMs !== null && <span className="block text-muted">+{formatElapsed(row.timeMs - originMs)}</span>}
        </span>
        <span className="min-w-0">
          <span className={cn('block font-bold leading-tight', row.voided && 'line-through opacity-70')}>{row.label}</span>
          {(row.detail || row.voided || row.amended || !row.mine) && (
            <span className="block truncate text-sm text-muted">
              {row.voided ? `Voided: ${row.voidReason ?? ''}` : row.detail}
              {row.amended && !row.voided ? ' (edited)' : ''}
              {!row.mine ? ` · ${row.authorLabel}` : ''}
            </span>
          )}
        </span>
        <span className={cn('text-lg font-bold', row.state === 'refused' ? 'text-danger' : 'text-muted')} title={stateWords[row.state]}>
          <span aria-hidden>{stateMarks[row.state]}</span>
          <span className="sr-only">{stateWords[row.state]}</span>
        </span>
      </button>
    </li>
  );
}, sameRow);
