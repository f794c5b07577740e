import type { ReactNode } from 'react';
import { cn } from '@/lib/cn.ts';

export type Tone = 'info' | 'ok' | 'danger' | 'caution';

const tones: Record<Tone, string> = {
  info: 'bg-info-soft border-line-strong text-text',
  ok: 'bg-ok-soft border-ok text-text',
  danger: 'bg-danger-soft border-danger text-text',
  caution: 'bg-caution-soft border-caution-line text-text',
};
// A shape per tone as well as a colour, so the tone reads without colour vision.
const marks: Record<Tone, string> = { info: 'i', ok: '✓', danger: '!', caution: '△' };

type Props = { tone?: Tone; title?: ReactNode; children?: ReactNode; className?: string; role?: 'alert' | 'status' | 'note' };

export function Banner({ tone = 'info', title, children, className, role }: Props) {
  return (
    <div role={role ?? (tone === 'danger' ? 'alert' : undefined)} className={cn('flex gap-3 rounded-card border-l-8 border-y border-r px-4 py-3', tones[tone], className)}>
      <span aria-hidden className="mt-0.5 flex size-7 shrink-0 items-center justify-center rounded-full border-2 border-current text-sm font-bold">
        {marks[tone]}
      </span>
      <div className="min-w-0 flex-1">
        {title && <p className="font-bold">{title}</p>}
        {children && <div className={title ? 'mt-1' : undefined}>{children}</div>}
      </div>
    </div>
  );
}
