import { memo } from 'react';
import { cn } from '@/lib/cn.ts';
import { formatElapsed, useNow } from '../hooks/use-now.ts';
import type { LiveCounts } from '../live-counts.ts';

/**
 * The live counts the nurse glances at: clips and loops (they stay in the patient and are charged), the
 * bleeds, and the injected volume. Read from the record computed over this tablet's events, so they hold
 * offline too. Each figure has a test id the browser tests and the bench read.
 */
export const CounterBoard = memo(function CounterBoard({ counts }: { counts: LiveCounts }) {
  return (
    <dl className="grid grid-cols-3 gap-2 portrait:grid-cols-6" aria-label="Counts so far">
      <Figure id="clips-deployed" label="Clips deployed" value={counts.clipsDeployed} />
      <Figure id="clips-misfired" label="Misfired" value={counts.clipsMisfired} />
      <Figure id="loops-placed" label="Loops placed" value={counts.loopsPlaced} />
      <Figure id="bleeds-open" label="Bleeds open" value={counts.bleedsOpen} alarm={counts.bleedsOpen > 0}>
        {counts.openBleedSinceMs !== null && <BleedTimer since={counts.openBleedSinceMs} />}
      </Figure>
      <Figure id="bleeds-controlled" label="Controlled" value={counts.bleedsControlled} />
      <Figure id="injection-ml" label="Injected" value={formatMl(counts.injectionMl)} unit="ml" />
    </dl>
  );
});

/**
 * One figure. Memoised, so a tap redraws only the figure it changed; contained, so the new number is
 * laid out and painted inside its box without touching the rest of the screen.
 */
const Figure = memo(function Figure({ id, label, value, unit, alarm = false, children }: { id: string; label: string; value: number | string; unit?: string; alarm?: boolean; children?: React.ReactNode }) {
  return (
    <div className={cn('flex flex-col rounded-control border-2 px-3 py-1.5 contain-content', alarm ? 'border-danger bg-danger-soft' : 'border-line bg-surface')}>
      <dt className="text-sm font-bold text-muted">{label}</dt>
      <dd className="flex items-baseline gap-1.5">
        <span data-testid={`count-${id}`} className="text-3xl font-bold tabular-nums">{value}</span>
        {unit && <span className="text-base text-muted">{unit}</span>}
        {children}
      </dd>
    </div>
  );
});

/** The open bleed's running time; the only part of the board that re-renders every second. */
function BleedTimer({ since }: { since: number }) {
  const now = useNow();
  return (
    <span data-testid="open-bleed-elapsed" className="ml-auto font-mono text-lg font-bold text-danger" aria-label="Open bleed for">
      {formatElapsed(now - since)}
    </span>
  );
}

const formatMl = (ml: number) => (Number.isInteger(ml) ? String(ml) : ml.toFixed(1));
