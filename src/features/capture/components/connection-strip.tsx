import { memo } from 'react';
import { cn } from '@/lib/cn.ts';


const words = { online: 'Online', syncing: 'Sending', offline: 'Offline' } as const;
// A shape per state as well as a colour, so it reads without colour vision.
const marks = { online: '●', syncing: '↑', offline: '○' } as const;

/**
 * Always on screen: is this tablet connected, how many taps wait to be sent, and how many the server
 * refused (those need a person). Offline is not an error: every tap is kept on the tablet.
 */
type Props = { state: 'offline' | 'syncing' | 'online'; waiting: number; refused: number; lastError: string | null; onOpenRefused: () => void };

export const ConnectionStrip = memo(function ConnectionStrip({ onOpenRefused, ...view }: Props) {
  return (
    <div className="flex items-center gap-2" data-testid="connection" data-state={view.state}>
      <span
        role="status"
        aria-live="polite"
        className={cn(
          'flex min-h-touch items-center gap-2 rounded-control border-2 px-3 font-bold',
          view.state === 'offline' ? 'border-caution-line bg-caution-soft text-caution' : view.state === 'syncing' ? 'border-line-strong bg-info-soft' : 'border-ok bg-ok-soft text-ok',
        )}
        title={view.lastError ?? undefined}
      >
        <span aria-hidden>{marks[view.state]}</span>
        {words[view.state]}
        <span data-testid="waiting-count" className="font-normal tabular-nums">
          {view.waiting > 0 ? `· ${view.waiting} waiting` : view.state === 'offline' ? '· saved here' : ''}
        </span>
      </span>
      {view.refused > 0 && (
        <button type="button" onClick={onOpenRefused} data-testid="refused-open"
          className="min-h-touch rounded-control border-2 border-danger bg-danger-soft px-3 font-bold text-text">
          <span aria-hidden>! </span>{view.refused} refused
        </button>
      )}
    </div>
  );
});
