import { useState } from 'react';
import { Button } from '@/components/ui/button.tsx';
import { Dialog } from '@/components/ui/dialog.tsx';
import { Input } from '@/components/ui/field.tsx';
import { cn } from '@/lib/cn.ts';
import type { PayloadOf } from '#shared/schemas/events.ts';
import { allAnswered, timeOutItems, toCheckPayloadItems, type CheckAnswers } from '../checklists.ts';
import { CheckList } from './check-list.tsx';

const skipReasons = ['Emergency: no time for the check', 'Done outside the room', 'Team not complete yet'];

/**
 * The time-out before the scope goes in. Recording without it is allowed (the case may be an
 * emergency), but a skip needs a reason, and the screen and the record show that it was skipped.
 */
export function TimeOutSheet({ open, onClose, onRecord }: { open: boolean; onClose: () => void; onRecord: (payload: PayloadOf<'time_out'>) => void }) {
  const [value, setValue] = useState<CheckAnswers>({});
  const [skipping, setSkipping] = useState(false);
  const [reason, setReason] = useState('');
  const done = allAnswered(timeOutItems, value);
  const finish = (payload: PayloadOf<'time_out'>) => { onRecord(payload); setValue({}); setSkipping(false); setReason(''); onClose(); };
  return (
    <Dialog open={open} onClose={onClose} title="Time-out before scope in" placement="sheet">
      <div className="flex max-h-[70dvh] flex-col gap-3 overflow-y-auto">
        <p className="text-muted">Say each item aloud with the team; answer as said.</p>
        <CheckList items={timeOutItems} value={value} onChange={setValue} />
        {skipping && (
          <div className="flex flex-col gap-2 rounded-control border-2 border-caution-line bg-caution-soft p-3" role="group" aria-label="Skip the time-out">
            <p className="font-bold">Why is the time-out skipped? The record will show it.</p>
            <div className="flex flex-wrap gap-2">
              {skipReasons.map((r) => (
                <button key={r} type="button" aria-pressed={reason === r} onClick={() => setReason(r)}
                  className={cn('min-h-touch rounded-control border-2 px-3 font-bold', reason === r ? 'border-primary bg-primary text-on-primary' : 'border-line-strong bg-surface')}>{r}</button>
              ))}
            </div>
            <Input aria-label="Reason for skipping" maxLength={500} value={reason} onChange={(e) => setReason(e.target.value)} />
          </div>
        )}
      </div>
      <div className="mt-4 flex flex-wrap gap-3">
        {!skipping ? (
          <>
            <Button variant="primary" size="lg" className="flex-1" disabled={!done} onClick={() => finish({ items: toCheckPayloadItems(timeOutItems, value) })}>
              {done ? 'Record time-out' : 'Answer every item'}
            </Button>
            <Button size="lg" onClick={() => setSkipping(true)}>Skip…</Button>
          </>
        ) : (
          <>
            <Button variant="danger" size="lg" className="flex-1" disabled={!reason.trim()} onClick={() => finish({ skipped: { reason: reason.trim() }, items: toCheckPayloadItems(timeOutItems, value) })}>
              Record as skipped
            </Button>
            <Button size="lg" onClick={() => setSkipping(false)}>Back to the check</Button>
          </>
        )}
        <Button size="lg" variant="quiet" onClick={onClose}>Not now</Button>
      </div>
    </Dialog>
  );
}
