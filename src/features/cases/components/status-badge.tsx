import type { CaseStatus } from '#shared/schemas/cases.ts';
import { cn } from '@/lib/cn.ts';

/** Our own words for the case states; each has its own glyph, so the state reads without colour. */
export const statusLabels: Record<CaseStatus, string> = {
  scheduled: 'Booked',
  recording: 'Recording',
  closed: 'Record closed',
  reported: 'Report signed',
  cancelled: 'Cancelled',
};

const looks: Record<CaseStatus, { glyph: string; cls: string }> = {
  scheduled: { glyph: '○', cls: 'border-line-strong bg-surface text-text' },
  recording: { glyph: '●', cls: 'border-primary bg-primary text-on-primary' },
  closed: { glyph: '■', cls: 'border-ok bg-ok-soft text-text' },
  reported: { glyph: '✓', cls: 'border-ok bg-ok-soft text-text' },
  cancelled: { glyph: '✕', cls: 'border-line bg-sunken text-muted line-through' },
};

export function StatusBadge({ status, className }: { status: CaseStatus; className?: string }) {
  const look = looks[status];
  return (
    <span className={cn('inline-flex items-center gap-1.5 rounded-full border-2 px-3 py-0.5 text-sm font-bold', look.cls, className)}>
      <span aria-hidden>{look.glyph}</span>
      {statusLabels[status]}
    </span>
  );
}
