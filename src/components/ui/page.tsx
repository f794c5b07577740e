import type { ReactNode } from 'react';
import { cn } from '@/lib/cn.ts';

/** A screen's heading row and body width. */
export function Page({ title, actions, children, className, wide = false }: { title: ReactNode; actions?: ReactNode; children: ReactNode; className?: string; wide?: boolean }) {
  return (
    <div className={cn('mx-auto w-full px-4 py-6 sm:px-6', wide ? 'max-w-6xl' : 'max-w-3xl', className)}>
      <div className="mb-6 flex flex-wrap items-end justify-between gap-4">
        <h1 className="text-3xl font-bold">{title}</h1>
        {actions && <div className="flex flex-wrap gap-3">{actions}</div>}
      </div>
      {children}
    </div>
  );
}

/** A busy state that says what is loading. */
export function Loading({ label = 'Loading' }: { label?: string }) {
  return (
    <p role="status" className="flex items-center gap-3 py-8 text-lg text-muted">
      <span aria-hidden className="size-5 animate-spin rounded-full border-[3px] border-current border-r-transparent" />
      {label}…
    </p>
  );
}
