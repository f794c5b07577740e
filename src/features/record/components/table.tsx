import type { ReactNode } from 'react';
import { cn } from '@/lib/cn.ts';

/** A section of the record with its heading (h2) and an id the page's index links to. */
export function Section({ id, title, children, className }: { id: string; title: string; children: ReactNode; className?: string }) {
  return (
    <section aria-labelledby={`${id}-h`} id={id} className={cn('flex flex-col gap-3 scroll-mt-4', className)}>
      <h2 id={`${id}-h`} className="text-2xl font-bold">{title}</h2>
      {children}
    </section>
  );
}

/** A ruled table that scrolls sideways on a narrow screen instead of squeezing its columns. */
export function Table({ head, rows, caption, empty = 'None recorded.', numeric = [], widths }: {
  head: string[]; rows: ReactNode[][]; caption: string; empty?: string; numeric?: number[];
  /** Fixed column widths (CSS lengths, '' for the rest), so tables of one kind line up one under another. */
  widths?: string[];
}) {
  if (rows.length === 0) return <p className="text-muted">{empty}</p>;
  return (
    <div className="overflow-x-auto rounded-card border-2 border-line bg-surface">
      <table className={cn('w-full border-collapse text-left', widths && 'min-w-[40rem] table-fixed')}>
        <caption className="sr-only">{caption}</caption>
        {widths && <colgroup>{widths.map((w, i) => <col key={i} style={w ? { width: w } : undefined} />)}</colgroup>}
        <thead className="bg-sunken">
          <tr>{head.map((h, i) => <th key={h} scope="col" className={cn('whitespace-nowrap border-b-2 border-line px-3 py-2 font-bold', numeric.includes(i) && 'text-right')}>{h}</th>)}</tr>
        </thead>
        <tbody>
          {rows.map((r, i) => (
            <tr key={i} className="border-b border-line last:border-b-0 align-top">
              {r.map((c, j) => <td key={j} className={cn('px-3 py-2', numeric.includes(j) && 'text-right tabular-nums')}>{c}</td>)}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** Facts as term and value, two columns of pairs on a wide screen. */
export function Facts({ items }: { items: [string, ReactNode][] }) {
  return (
    <dl className="grid gap-x-6 gap-y-3 rounded-card border-2 border-line bg-surface p-4 sm:grid-cols-2">
      {items.map(([k, v]) => (
        <div key={k}>
          <dt className="text-sm font-bold text-muted">{k}</dt>
          <dd className="text-lg">{v}</dd>
        </div>
      ))}
    </dl>
  );
}

/** Big figures in a grid of tiles: what a glance at the record looks for first. */
export function Tiles({ items }: { items: { label: string; value: ReactNode; testId?: string; alert?: boolean }[] }) {
  return (
    <dl className="grid grid-cols-2 gap-3 sm:grid-cols-4">
      {items.map((t) => (
        <div key={t.label} className={cn('flex flex-col-reverse justify-end rounded-card border-2 bg-surface px-4 py-3', t.alert ? 'border-danger' : 'border-line')}>
          <dt className="text-sm font-bold text-muted">{t.label}</dt>
          <dd className="text-3xl font-bold tabular-nums" data-testid={t.testId}>{t.value}</dd>
        </div>
      ))}
    </dl>
  );
}
