import type { ReactNode } from 'react';
import { Mark } from '@/components/ui/mark.tsx';

/** The frame of the signed-out screens: the name, the mark and one card. */
export function AuthFrame({ title, intro, children }: { title: string; intro?: ReactNode; children: ReactNode }) {
  return (
    <main className="ruled flex min-h-dvh items-start justify-center px-4 py-10 sm:items-center">
      <div className="w-full max-w-lg">
        <p className="mb-6 flex items-center gap-3 text-2xl font-bold tracking-wide">
          <Mark size={48} />
          Ledgerline
        </p>
        <div className="rounded-card border-2 border-line bg-surface p-6 shadow-card sm:p-8">
          <h1 className="text-3xl font-bold">{title}</h1>
          {intro && <div className="mt-2 text-muted">{intro}</div>}
          <div className="mt-6">{children}</div>
        </div>
      </div>
    </main>
  );
}
