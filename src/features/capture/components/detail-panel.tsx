import { useState } from 'react';
import { Button } from '@/components/ui/button.tsx';
import { Input } from '@/components/ui/field.tsx';
import { cn } from '@/lib/cn.ts';
import type { EventKind } from '#shared/schemas/events.ts';
import { amendFields, createPayload } from '../amend.ts';
import { detailFields } from '../details.ts';
import { formatClock } from '../hooks/use-now.ts';
import { DetailInput, type ItemControl, type Values } from './detail-fields.tsx';

export type PanelTarget = {
  /** A key for the panel's state: the event id, or a tap's own key while its id is not known yet. */
  key: string;
  kind: EventKind;
  label: string;
  timeMs: number;
  payload: Record<string, unknown>;
  voided: boolean;
};

type Props = {
  target: PanelTarget;
  /** after-tap: the quick sheet right after a tap; edit: a row opened from the list; create: sheet first. */
  mode: 'after-tap' | 'edit' | 'create';
  onAmend: (fields: Record<string, unknown>) => void;
  onCreate: (payload: Record<string, unknown>) => void;
  onVoid: (reason: string) => void;
  onClose: () => void;
  ItemInput?: ItemControl;
  /** The id of the event being detailed, once known (none while creating): a scanned label is linked to it. */
  eventId?: string;
  className?: string;
};

const voidReasons = ['Tapped by mistake', 'Recorded twice', 'Wrong button', 'Did not happen'];

/**
 * The quick sheet: a panel beside the pad, never over it, so the next tap is never blocked by it. It
 * never delays a tap either: the event is already recorded when it opens, and its answers are recorded
 * as an `amend` of that event (always an amendment, even while the event is still only on this tablet:
 * the log stays append-only everywhere, an event in flight is never rewritten under the engine, and the
 * record shows when the detail was added).
 */
export function DetailPanel({ target, mode, onAmend, onCreate, onVoid, onClose, ItemInput, eventId, className }: Props) {
  const fields = detailFields[target.kind] ?? [];
  const [values, setValues] = useState<Values>(() => ({ ...target.payload }));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [voiding, setVoiding] = useState(false);
  const [reason, setReason] = useState('');

  const save = () => {
    if (mode === 'create') {
      const r = createPayload(target.kind, fields, target.payload, values);
      if (!r.ok) return setErrors(r.errors);
      onCreate(r.payload);
      return onClose();
    }
    const r = amendFields(target.kind, fields, target.payload, values);
    if (!r.ok) return setErrors(r.errors);
    if (Object.keys(r.fields).length) onAmend(r.fields);
    onClose();
  };

  return (
    <section aria-label={`Details of ${target.label}`} data-testid="detail-panel" className={cn('flex min-h-0 flex-col gap-3 rounded-card border-2 border-primary bg-surface p-3', className)}>
      <header className="flex items-start justify-between gap-2">
        <div>
          <h2 className="text-xl font-bold">{target.label}{target.voided && ' (voided)'}</h2>
          <p className="text-sm text-muted">
            {mode === 'create' ? 'Recorded when you save' : `Recorded ${formatClock(target.timeMs)}`}
            {mode === 'after-tap' && ' · details are optional'}
          </p>
        </div>
        <Button size="md" variant="secondary" onClick={onClose}>{mode === 'create' ? 'Cancel' : 'Close'}</Button>
      </header>
      <div className="flex min-h-0 flex-col gap-3 overflow-y-auto overscroll-contain">
        {fields.map((f) => (
          <div key={f.name}>
            <DetailInput field={f} value={values[f.name]} onChange={(v) => setValues((s) => ({ ...s, [f.name]: v }))} ItemInput={ItemInput} eventId={eventId} />
            {errors[f.name] && <p role="alert" className="mt-1 font-bold text-danger">{errors[f.name]}</p>}
          </div>
        ))}
        {voiding && (
          <div className="flex flex-col gap-2 rounded-control border-2 border-danger p-2" role="group" aria-label="Void this event">
            <p className="font-bold">Why is it void?</p>
            <div className="flex flex-wrap gap-2">
              {voidReasons.map((r) => (
                <button key={r} type="button" aria-pressed={reason === r} onClick={() => setReason(r)}
                  className={cn('min-h-touch rounded-control border-2 px-3 font-bold', reason === r ? 'border-danger bg-danger-soft' : 'border-line-strong bg-surface')}>{r}</button>
              ))}
            </div>
            <Input aria-label="Reason in your words" maxLength={500} value={reason} onChange={(e) => setReason(e.target.value)} />
            <Button variant="danger" disabled={!reason.trim()} onClick={() => { onVoid(reason.trim()); onClose(); }}>Void with this reason</Button>
          </div>
        )}
      </div>
      <footer className="flex flex-wrap gap-2">
        {fields.length > 0 && !target.voided && <Button variant="primary" size="lg" className="flex-1" onClick={save}>{mode === 'create' ? 'Record' : 'Save details'}</Button>}
        {mode === 'edit' && !target.voided && !voiding && <Button variant="danger" size="lg" onClick={() => setVoiding(true)}>Void…</Button>}
      </footer>
    </section>
  );
}
