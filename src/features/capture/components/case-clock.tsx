import { memo } from 'react';
import type { CaseRecord } from '#shared/domain/record/types.ts';
import { formatClock, formatElapsed, useNow } from '../hooks/use-now.ts';

export type ClockView = {
  /** Corrected ms the clock counts from: scope in, else the first event; null before any event. */
  originMs: number | null;
  /** From scope in (true) or only from the first event (false). */
  fromScopeIn: boolean;
  /** Corrected ms at which it stopped (scope out); null while running. */
  stoppedMs: number | null;
  phase: string;
};

const phaseWords = { resection: 'Resection', closure: 'Closure', retrieval: 'Retrieval' } as const;

/** What the header's clock shows, from the record (our phase names). */
export function clockView(record: CaseRecord): ClockView {
  const firstIn = record.scopeIntervals[0];
  const last = record.scopeIntervals.at(-1);
  const first = record.timeline.find((e) => e.kind !== 'time_out');
  const originMs = firstIn?.inMs ?? first?.atMs ?? null;
  const stoppedMs = last && last.outMs !== null ? last.outMs : null;
  const running = record.phases.filter((p) => p.name !== 'total' && p.endMs === null).sort((a, b) => b.startMs - a.startMs)[0];
  let phase = 'Before scope in';
  if (record.signOut.status === 'present') phase = 'Signed out';
  else if (running) phase = phaseWords[running.name as keyof typeof phaseWords];
  else if (last && last.outMs === null) phase = 'Scope in';
  else if (last) phase = 'Scope out';
  return { originMs, fromScopeIn: Boolean(firstIn), stoppedMs, phase };
}

export const sameClock = (a: ClockView, b: ClockView) =>
  a.originMs === b.originMs && a.fromScopeIn === b.fromScopeIn && a.stoppedMs === b.stoppedMs && a.phase === b.phase;

/** The running case time (h:mm:ss), the room's time of day, and the phase. Re-renders itself each second. */
export const CaseClock = memo(function CaseClock({ view, offsetMs }: { view: ClockView; offsetMs: number }) {
  const now = useNow() + offsetMs;
  const end = view.stoppedMs ?? now;
  return (
    <div className="flex items-center gap-4" data-testid="case-clock">
      <div className="leading-none">
        <p className="text-xs font-bold uppercase tracking-wide text-muted">{view.originMs === null ? 'Case time' : view.fromScopeIn ? 'Since scope in' : 'Since first event'}</p>
        <p className="font-mono text-4xl font-bold tabular-nums" data-testid="case-elapsed">{view.originMs === null ? '0:00' : formatElapsed(end - view.originMs)}</p>
      </div>
      <div className="leading-tight">
        <p className="font-mono text-lg tabular-nums" aria-label="Time of day">{formatClock(now)}</p>
        <p className="font-bold" data-testid="phase">{view.phase}</p>
      </div>
    </div>
  );
});
