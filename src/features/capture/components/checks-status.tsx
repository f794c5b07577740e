import { memo } from 'react';
import type { CheckRecord } from '#shared/domain/record/types.ts';
import { cn } from '@/lib/cn.ts';
import { formatClock } from '../hooks/use-now.ts';

type Props = { timeOut: CheckRecord; signOut: CheckRecord; closed: boolean; onTimeOut: () => void; onSignOut: () => void };

const chip = 'inline-flex min-h-touch items-center gap-2 rounded-control border-2 px-3 font-bold text-left leading-tight';

/**
 * The two room checks in the header. A missing or skipped time-out stays visible for the whole case
 * (the record flags it too); a time-out can still be run late, and the record shows when it was.
 */
export const ChecksStatus = memo(function ChecksStatus({ timeOut, signOut, closed, onTimeOut, onSignOut }: Props) {
  return (
    <div className="flex flex-wrap items-center gap-2">
      {timeOut.status === 'present' ? (
        <span className={cn(chip, 'border-ok bg-ok-soft text-text')} data-testid="time-out-status" data-status="present">
          <span aria-hidden>✓</span> Time-out {timeOut.atMs !== null && formatClock(timeOut.atMs)}
          {timeOut.answeredNo.length > 0 && <span className="text-danger">· {timeOut.answeredNo.length} answered no</span>}
        </span>
      ) : (
        <button type="button" onClick={onTimeOut} disabled={closed} data-testid="time-out-status" data-status={timeOut.status}
          className={cn(chip, 'border-caution-line bg-caution-soft text-caution')} title={timeOut.reason ?? undefined}>
          <span aria-hidden>△</span>
          {timeOut.status === 'skipped' ? <span>Time-out skipped<span className="block text-sm font-normal">{timeOut.reason}</span></span> : 'Time-out not done'}
        </button>
      )}
      {signOut.status === 'present' || closed ? (
        <span className={cn(chip, 'border-line-strong bg-sunken')} data-testid="sign-out-status" data-status="present">
          <span aria-hidden>■</span> Signed out {signOut.atMs !== null && formatClock(signOut.atMs)}
        </span>
      ) : (
        <button type="button" onClick={onSignOut} data-testid="sign-out-status" data-status="missing" className={cn(chip, 'border-line-strong bg-surface')}>
          Sign-out…
        </button>
      )}
    </div>
  );
});
