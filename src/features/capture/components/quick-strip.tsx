import { memo, useState } from 'react';
import { cn } from '@/lib/cn.ts';
import { detailFields, type DetailField } from '../details.ts';
import type { PanelTarget } from './detail-panel.tsx';

type Props = {
  target: PanelTarget;
  /** Records the choice at once, as an amendment of the tapped event. */
  onPick: (fields: Record<string, unknown>) => void;
  onMore: () => void;
  onClose: () => void;
};

/** The chips of a field that can be answered in one touch, or null (free text, a scan). */
function chipsOf(field: DetailField): { label: string; value: unknown }[] | null {
  switch (field.type) {
    case 'choice': return field.options.map((o) => ({ label: o.label, value: o.value }));
    case 'boolean': return [{ label: field.yes, value: true }, { label: field.no, value: false }];
    case 'number': return field.presets.map((p) => ({ label: field.unit ? `${p} ${field.unit}` : String(p), value: p }));
    case 'text': return field.presets?.map((p) => ({ label: p, value: p })) ?? null;
    default: return null;
  }
}

/**
 * The quick sheet right after a tap: one line under the counts with the tap's most asked-for detail as
 * chips (a bleed's severity, a clip's purpose, an injection's volume). One touch on a chip records it
 * as an amendment of the event; "More" opens every field. It takes no room from the pad and never
 * waits on anything: the event is already recorded.
 */
export const QuickStrip = memo(function QuickStrip({ target, onPick, onMore, onClose }: Props) {
  const fields = detailFields[target.kind] ?? [];
  const field = fields.find((f) => chipsOf(f));
  const chips = field ? chipsOf(field)! : [];
  const [picked, setPicked] = useState<unknown>(undefined);
  return (
    <section aria-label={`Details of ${target.label}`} data-testid="quick-strip" className="flex flex-col gap-1.5 rounded-card border-2 border-primary bg-surface px-3 py-2">
      <p className="text-sm font-bold text-muted">{target.label}{field ? ` · ${field.label}` : ''} <span className="font-normal">(optional)</span></p>
      <div className="flex flex-wrap items-center gap-2">
        {field && chips.map((c) => (
          <button key={c.label} type="button" aria-pressed={picked === c.value}
            onClick={() => { setPicked(c.value); onPick({ [field.name]: c.value }); }}
            className={cn('min-h-touch rounded-control border-2 px-3 font-bold', picked === c.value ? 'border-primary bg-primary text-on-primary' : 'border-line-strong bg-surface')}>
            {c.label}
          </button>
        ))}
        <button type="button" onClick={onMore} className="min-h-touch rounded-control border-2 border-line-strong bg-sunken px-3 font-bold">More…</button>
        <button type="button" onClick={onClose} aria-label="Close the details" className="ml-auto min-h-touch min-w-touch rounded-control border-2 border-line-strong px-3 font-bold">✕</button>
      </div>
    </section>
  );
});
