import { memo } from 'react';
import { useNavigate } from 'react-router';
import { cn } from '@/lib/cn.ts';
import { signInAgain } from '@/lib/session.ts';

type Shown = 'offline' | 'syncing' | 'online' | 'signed-out';
const words: Record<Shown, string> = { online: 'Online', syncing: 'Sending', offline: 'Offline', 'signed-out': 'Signed out' };
// A shape per state as well as a colour, so it reads without colour vision.
const marks: Record<Shown, string> = { online: '●', syncing: '↑', offline: '○', 'signed-out': '⊘' };
const looks: Record<Shown, string> = {
  online: 'border-ok bg-ok-soft text-ok',
  syncing: 'border-line-strong bg-info-soft',
  offline: 'border-caution-line bg-caution-soft text-caution',
  'signed-out': 'border-danger bg-danger-soft text-text',
};

/**
 * Always on screen: is this tablet connected, how many taps wait to be sent, and how many the server
 * refused (those need a person). Offline is not an error: every tap is kept on the tablet. Signed out
 * is not the network: the server no longer knows this tablet's session, and the taps wait here for the
 * next sign-in, which the strip offers.
 */
type Props = { state: 'offline' | 'syncing' | 'online'; waiting: number; refused: number; lastError: string | null; sessionEnded: boolean; onOpenRefused: () => void };

export const ConnectionStrip = memo(function ConnectionStrip({ onOpenRefused, ...view }: Props) {
  const navigate = useNavigate();
  const shown: Shown = view.sessionEnded ? 'signed-out' : view.state;
  return (
    <div className="flex items-center gap-2" data-testid="connection" data-state={shown}>
      <span
        role="status"
        aria-live="polite"
        className={cn('flex min-h-touch items-center gap-2 rounded-control border-2 px-3 font-bold', looks[shown])}
        title={view.lastError ?? undefined}
      >
        <span aria-hidden>{marks[shown]}</span>
        {words[shown]}
        <span data-testid="waiting-count" className="font-normal tabular-nums">
          {view.waiting > 0 ? `· ${view.waiting} waiting` : shown === 'offline' || shown === 'signed-out' ? '· saved here' : ''}
        </span>
      </span>
      {shown === 'signed-out' && (
        <button type="button" onClick={() => void signInAgain(navigate)} data-testid="sign-in-again"
          className="min-h-touch rounded-control border-2 border-primary bg-primary px-3 font-bold text-on-primary">
          Sign in again
        </button>
      )}
      {view.refused > 0 && (
        <button type="button" onClick={onOpenRefused} data-testid="refused-open"
          className="min-h-touch rounded-control border-2 border-danger bg-danger-soft px-3 font-bold text-text">
          <span aria-hidden>! </span>{view.refused} refused
        </button>
      )}
    </div>
  );
});
