import type { ReactNode } from 'react';

/** A titled group of the form; on a wide tablet its fields sit two to a row. */
export function Fieldset({ legend, children }: { legend: string; children: ReactNode }) {
  return (
    <fieldset className="rounded-card border-2 border-line bg-surface p-5 shadow-card">
      <legend className="px-2 text-xl font-bold">{legend}</legend>
      <div className="grid gap-5 md:grid-cols-2">{children}</div>
    </fieldset>
  );
}
