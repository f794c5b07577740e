import { memo, useSyncExternalStore } from 'react';
import { Link } from 'react-router';
import type { CheckRecord } from '#shared/domain/record/types.ts';
import type { CaseSummary } from '#shared/schemas/cases.ts';
import { buttonClass } from '@/components/ui/button.tsx';
import { useTheme } from '@/lib/theme.ts';
import type { SyncStatus } from '@/sync/index.ts';
import { useSyncEngine, useSyncStatusPart } from '@/sync/react.ts';
import { useAfterPaint } from '../hooks/after-paint.ts';
import { CaseClock, type ClockView } from './case-clock.tsx';
import { ChecksStatus } from './checks-status.tsx';
import { ConnectionStrip } from './connection-strip.tsx';

type Props = {
  caseId: string;
  summary: CaseSummary | null;
  clock: ClockView;
  timeOut: CheckRecord;
  signOut: CheckRecord;
  closed: boolean;
  onTimeOut: () => void;
  onSignOut: () => void;
  onOpenRefused: () => void;
};

/**
 * The recorder's header: who the case is for (name and hospital number, the identifiers a time-out
 * checks), the case clock and phase, the two checks, the connection. Memoised: a tap redraws it only
 * when one of these changed.
 */
export const CaptureHeader = memo(function CaptureHeader({ caseId, summary, clock, timeOut, signOut, closed, onTimeOut, onSignOut, onOpenRefused }: Props) {
  const offsetMs = useClockOffset();
  return (
    <header className="flex flex-wrap items-center gap-x-3 gap-y-2 border-b-2 border-line bg-surface px-3 py-2">
      <Link to={`/cases/${caseId}`} className={buttonClass('secondary', 'md')} aria-label="Back to the case page">←</Link>
      <div className="min-w-0 max-w-[15rem] leading-tight">
        <p className="truncate text-lg font-bold" data-testid="capture-patient">
          {summary ? `${summary.patient.familyName.toUpperCase()}, ${summary.patient.givenName}` : 'Case'}
        </p>
        <p className="truncate text-sm text-muted">
          {summary ? `${summary.patient.hospitalNumber} · ${summary.procedureType.toUpperCase()} · ${summary.room.name}` : caseId}
        </p>
      </div>
      <CaseClock view={clock} offsetMs={offsetMs} />
      <ChecksStatus timeOut={timeOut} signOut={signOut} closed={closed} onTimeOut={onTimeOut} onSignOut={onSignOut} />
      <div className="ml-auto flex items-center gap-2">
        <LiveConnection onOpenRefused={onOpenRefused} />
        <ThemeToggle />
      </div>
    </header>
  );
});

type ConnectionView = Pick<SyncStatus, 'state' | 'waiting' | 'lastError' | 'sessionEnded'> & { refused: number };
const connectionView = (s: SyncStatus): ConnectionView => ({ state: s.state, waiting: s.waiting, refused: s.refused.length, lastError: s.lastError, sessionEnded: s.sessionEnded });
const sameConnection = (a: ConnectionView, b: ConnectionView) =>
  a.state === b.state && a.waiting === b.waiting && a.refused === b.refused && a.lastError === b.lastError && a.sessionEnded === b.sessionEnded;

/**
 * The connection strip, subscribed to the sync status on its own: only a change of what it shows
 * redraws it (a tap going from saving to queued to sent changes none of it). A change is drawn in the
 * frame after the one that shows a tap's count and row (a tap's "1 waiting" a frame later), so the strip
 * never adds to that frame.
 */
function LiveConnection({ onOpenRefused }: { onOpenRefused: () => void }) {
  const view = useAfterPaint(useSyncStatusPart(connectionView, sameConnection));
  return <ConnectionStrip {...view} onOpenRefused={onOpenRefused} />;
}

/** Server minus tablet clock (ms, 0 before the first sample); re-renders its user only when it changes. */
export function useClockOffset(): number {
  const engine = useSyncEngine();
  return useSyncExternalStore(engine.status.subscribe, () => engine.status.getSnapshot().clock?.offsetMs ?? 0);
}

/** Dim room or light, for this kind of screen. */
function ThemeToggle() {
  const [theme, setTheme] = useTheme('capture');
  return (
    <button type="button" className={buttonClass('secondary', 'md')} aria-pressed={theme === 'dim'} onClick={() => setTheme(theme === 'dim' ? 'paper' : 'dim')}>
      {theme === 'dim' ? 'Light' : 'Dim'}
    </button>
  );
}
