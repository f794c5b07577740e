import { useId, type ComponentType } from 'react';
import { cn } from '@/lib/cn.ts';
import { Input, Textarea } from '@/components/ui/field.tsx';
import type { DetailField } from '../details.ts';

export type Values = Record<string, unknown>;

/**
 * A catalogue-item control (a scan field); the capture screen hands in the devices feature's one.
 * `eventId` is the event being detailed, once its id is known, so that a scanned label is linked to it.
 */
export type ItemControl = ComponentType<{ value: string; onChange: (itemId: string) => void; label: string; eventId?: string }>;

const chip = (on: boolean) => cn(
  'min-h-touch rounded-control border-2 px-3 text-base font-bold',
  on ? 'border-primary bg-primary text-on-primary' : 'border-line-strong bg-surface text-text',
);

/** One detail field as big chips, a stepper or a text box. A second tap on a chosen chip clears it. */
export function DetailInput({ field, value, onChange, ItemInput, eventId }: { field: DetailField; value: unknown; onChange: (v: unknown) => void; ItemInput?: ItemControl; eventId?: string }) {
  const id = useId();
  const label = <span id={id} className="text-sm font-bold text-muted">{field.label}</span>;
  switch (field.type) {
    case 'choice':
      return (
        <div role="group" aria-labelledby={id} className="flex flex-col gap-1">
          {label}
          <div className="flex flex-wrap gap-2">
            {field.options.map((o) => (
              <button key={String(o.value)} type="button" aria-pressed={value === o.value} className={chip(value === o.value)} onClick={() => onChange(value === o.value ? undefined : o.value)}>
                {o.label}
              </button>
            ))}
          </div>
        </div>
      );
    case 'boolean':
      return (
        <div role="group" aria-labelledby={id} className="flex flex-col gap-1">
          {label}
          <div className="flex gap-2">
            {([[true, field.yes], [false, field.no]] as const).map(([v, text]) => (
              <button key={String(v)} type="button" aria-pressed={value === v} className={chip(value === v)} onClick={() => onChange(value === v ? undefined : v)}>{text}</button>
            ))}
          </div>
        </div>
      );
    case 'number': {
      const n = typeof value === 'number' ? value : undefined;
      const step = (d: number) => {
        const next = Math.round(((n ?? 0) + d) * 1000) / 1000;
        onChange(Math.min(field.max, Math.max(field.min, next)));
      };
      return (
        <div role="group" aria-labelledby={id} className="flex flex-col gap-1">
          {label}
          <div className="flex flex-wrap items-center gap-2">
            {field.presets.map((p) => (
              <button key={p} type="button" aria-pressed={n === p} className={chip(n === p)} onClick={() => onChange(n === p ? undefined : p)}>
                {p}{field.unit ? ` ${field.unit}` : ''}
              </button>
            ))}
            <button type="button" className={chip(false)} aria-label={`Less ${field.label}`} onClick={() => step(-field.step)}>−</button>
            <Input
              aria-label={`${field.label}${field.unit ? ` (${field.unit})` : ''}`}
              inputMode="decimal"
              className="w-24 text-center"
              value={n === undefined ? '' : String(n)}
              onChange={(e) => {
                const raw = e.target.value.replace(',', '.').trim();
                if (raw === '') return onChange(undefined);
                const parsed = Number(raw);
                if (Number.isFinite(parsed)) onChange(field.integer ? Math.round(parsed) : parsed);
              }}
            />
            <button type="button" className={chip(false)} aria-label={`More ${field.label}`} onClick={() => step(field.step)}>+</button>
          </div>
        </div>
      );
    }
    case 'text': {
      const s = typeof value === 'string' ? value : '';
      return (
        <div className="flex flex-col gap-1">
          <label htmlFor={`${id}-t`} className="text-sm font-bold text-muted">{field.label}</label>
          {field.presets && (
            <div className="flex flex-wrap gap-2">
              {field.presets.map((p) => (
                <button key={p} type="button" aria-pressed={s === p} className={chip(s === p)} onClick={() => onChange(s === p ? undefined : p)}>{p}</button>
              ))}
            </div>
          )}
          {field.multiline
            ? <Textarea id={`${id}-t`} maxLength={field.maxLength} value={s} onChange={(e) => onChange(e.target.value)} />
            : <Input id={`${id}-t`} maxLength={field.maxLength} value={s} onChange={(e) => onChange(e.target.value)} />}
        </div>
      );
    }
    case 'item': {
      const s = typeof value === 'string' ? value : '';
      if (ItemInput) return <ItemInput value={s} onChange={(v) => onChange(v || undefined)} label={field.label} eventId={eventId} />;
      return (
        <div className="flex flex-col gap-1">
          <label htmlFor={`${id}-i`} className="text-sm font-bold text-muted">{field.label}</label>
          <Input id={`${id}-i`} maxLength={64} value={s} onChange={(e) => onChange(e.target.value)} />
        </div>
      );
    }
  }
}
