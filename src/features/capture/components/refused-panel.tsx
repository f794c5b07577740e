import { useState } from 'react';
import type { RefusedItem, ResubmitChanges } from '@/sync/index.ts';
import { Button } from '@/components/ui/button.tsx';
import { Dialog } from '@/components/ui/dialog.tsx';
import { Input } from '@/components/ui/field.tsx';
import { eventLabels, correctedTimeMs } from '#shared/schemas/events.ts';
import { createPayload } from '../amend.ts';
import { detailFields } from '../details.ts';
import { formatClock } from '../hooks/use-now.ts';
import { labelOf } from '../rows.ts';
import { DetailInput, type ItemControl, type Values } from './detail-fields.tsx';

type Props = {
  open: boolean;
  onClose: () => void;
  refused: readonly RefusedItem[];
  onResubmit: (id: string, changes: ResubmitChanges) => Promise<unknown>;
  onDiscard: (id: string, why: string) => Promise<unknown>;
  ItemInput?: ItemControl;
};

/**
 * Events the server refused stay on this tablet until a person fixes them (sent again as a new event)
 * or discards them (the discard is itself recorded). Each shows the server's reason in its words.
 */
export function RefusedPanel({ open, onClose, refused, onResubmit, onDiscard, ItemInput }: Props) {
  return (
    <Dialog open={open} onClose={onClose} title="Refused by the server" placement="sheet">
      <div className="flex max-h-[70dvh] flex-col gap-3 overflow-y-auto">
        {refused.length === 0 && <p>Nothing refused is waiting.</p>}
        {refused.map((r) => <RefusedRow key={r.id} item={r} onResubmit={onResubmit} onDiscard={onDiscard} ItemInput={ItemInput} />)}
      </div>
      <div className="mt-4"><Button size="lg" onClick={onClose}>Close</Button></div>
    </Dialog>
  );
}

function RefusedRow({ item, onResubmit, onDiscard, ItemInput }: { item: RefusedItem } & Pick<Props, 'onResubmit' | 'onDiscard' | 'ItemInput'>) {
  const { event } = item;
  const fields = detailFields[event.kind] ?? [];
  const payload = event.payload as Record<string, unknown>;
  const [mode, setMode] = useState<'view' | 'fix' | 'discard'>('view');
  const [values, setValues] = useState<Values>(() => ({ ...payload }));
  const [why, setWhy] = useState('');
  const [error, setError] = useState<string | null>(null);
  // One decision at a time: a second tap while the first is being written would not record it twice
  // (the engine refuses it), but the buttons say so by being off.
  const [busy, setBusy] = useState(false);
  const run = (p: Promise<unknown>) => {
    setBusy(true);
    return p.then(() => setError(null), (err: unknown) => setError(err instanceof Error ? err.message : String(err))).finally(() => setBusy(false));
  };
  const fix = () => {
    // Fields the sheet does not show (a clip's outcome, a check's items) are kept as they were.
    const r = createPayload(event.kind, fields, payload, values);
    if (!r.ok) return setError(Object.values(r.errors).join('; '));
    void run(onResubmit(item.id, { payload: r.payload }));
  };
  return (
    <article data-refused={item.id} className="flex flex-col gap-2 rounded-control border-2 border-danger bg-danger-soft p-3">
      <p className="font-bold">{labelOf(event.kind, payload) || eventLabels[event.kind]} · {formatClock(correctedTimeMs(event))}</p>
      <p><span className="font-bold">Reason: </span>{item.reason}</p>
      {mode === 'fix' && fields.map((f) => (
        <DetailInput key={f.name} field={f} value={values[f.name]} onChange={(v) => setValues((s) => ({ ...s, [f.name]: v }))} ItemInput={ItemInput} />
      ))}
      {mode === 'discard' && <Input aria-label="Why discard it" placeholder="Why discard it (recorded)" maxLength={500} value={why} onChange={(e) => setWhy(e.target.value)} />}
      {error && <p role="alert" className="font-bold text-danger">{error}</p>}
      <div className="flex flex-wrap gap-2">
        {mode !== 'fix' && <Button onClick={() => setMode('fix')}>Fix…</Button>}
        {mode === 'fix' && <Button variant="primary" disabled={busy} onClick={fix}>Send again</Button>}
        {mode !== 'discard' && <Button variant="danger" onClick={() => setMode('discard')}>Discard…</Button>}
        {mode === 'discard' && <Button variant="danger" disabled={busy || !why.trim()} onClick={() => void run(onDiscard(item.id, why.trim()))}>Discard, recording why</Button>}
        {mode !== 'view' && <Button variant="quiet" onClick={() => setMode('view')}>Back</Button>}
      </div>
    </article>
  );
}
