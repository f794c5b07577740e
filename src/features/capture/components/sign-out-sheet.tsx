import { useState } from 'react';
import { Button } from '@/components/ui/button.tsx';
import { Dialog } from '@/components/ui/dialog.tsx';
import { Banner } from '@/components/ui/banner.tsx';
import { cn } from '@/lib/cn.ts';
import { UNSPECIFIED_ITEM } from '#shared/domain/record/index.ts';
import type { CaseRecord } from '#shared/domain/record/types.ts';
import type { PayloadOf } from '#shared/schemas/events.ts';
import { allAnswered, signOutItems, toCheckPayloadItems, type CheckAnswers } from '../checklists.ts';
import { CheckList } from './check-list.tsx';

type Props = {
  open: boolean;
  onClose: () => void;
  record: CaseRecord;
  itemLabel: (itemId: string) => string;
  onRecord: (payload: PayloadOf<'sign_out'>) => void;
};

/**
 * The sign-out at the end of the case: the device reconciliation from the record (per item, opened =
 * deployed + misfired + wasted; a difference is flagged, never corrected here), the check items, then the
 * `sign_out` event, which closes the record. Later corrections are amendments.
 */
export function SignOutSheet({ open, onClose, record, itemLabel, onRecord }: Props) {
  const [value, setValue] = useState<CheckAnswers>({});
  const done = allAnswered(signOutItems, value);
  const unaccounted = record.devices.filter((d) => d.flagged);
  const openBleeds = record.bleeds.filter((b) => b.controlledMs === null);
  const scopeIn = record.scopeIntervals.at(-1)?.outMs === null;
  return (
    <Dialog open={open} onClose={onClose} title="Sign-out and close the record" placement="sheet">
      <div className="flex max-h-[70dvh] flex-col gap-3 overflow-y-auto">
        <section aria-label="Device reconciliation">
          <h3 className="mb-1 text-lg font-bold">Devices: opened = deployed + misfired + wasted</h3>
          {record.devices.length === 0 ? <p className="text-muted">No devices recorded.</p> : (
            <table className="w-full border-collapse text-left tabular-nums" data-testid="reconciliation">
              <thead>
                <tr className="border-b-2 border-line-strong text-sm text-muted">
                  <th className="py-1 pr-2">Item</th><th className="px-2">Opened</th><th className="px-2">Deployed</th>
                  <th className="px-2">Misfired</th><th className="px-2">Wasted</th><th className="px-2">In patient</th><th className="px-2">Unaccounted</th>
                </tr>
              </thead>
              <tbody>
                {record.devices.map((d) => (
                  <tr key={d.itemId} data-item={d.itemId} data-flagged={d.flagged || undefined} className={cn('border-b border-line', d.flagged && 'bg-danger-soft font-bold')}>
                    <td className="py-1.5 pr-2">{d.itemId === UNSPECIFIED_ITEM ? 'Item not named (no scan)' : itemLabel(d.itemId)}</td>
                    <td className="px-2">{d.opened}</td><td className="px-2">{d.deployed}</td><td className="px-2">{d.misfired}</td>
                    <td className="px-2">{d.wasted}</td><td className="px-2">{d.inPatient}</td>
                    <td className="px-2">
                      {d.flagged ? <><span aria-hidden>! </span>{d.unaccounted}</> : d.unaccounted}
                      {d.opened === 0 && d.unaccounted < 0 && <span className="block text-sm font-normal text-muted">opening not recorded</span>}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
          {unaccounted.length > 0 && (
            <Banner tone="danger" className="mt-2" title={`${unaccounted.length} item${unaccounted.length > 1 ? 's do' : ' does'} not reconcile`}>
              Count again, then record a wasted or opened device, or note why under equipment problems.
            </Banner>
          )}
        </section>
        {scopeIn && (
          <Banner tone="danger" title="The scope is still in">
            Record scope out first. Once signed out the record takes only amendments: a scope out tapped later is
            refused, and the total time stays unknown.
          </Banner>
        )}
        {openBleeds.length > 0 && (
          <Banner tone="caution" title={`${openBleeds.length} bleed${openBleeds.length > 1 ? 's' : ''} without recorded haemostasis`}>
            The record will flag {openBleeds.length > 1 ? 'them' : 'it'} as open.
          </Banner>
        )}
        <CheckList items={signOutItems} value={value} onChange={setValue} notes={['equipment_problems', 'handover']} />
      </div>
      <div className="mt-4 flex flex-wrap gap-3">
        <Button variant="primary" size="lg" className="flex-1" disabled={!done}
          onClick={() => { onRecord({ items: toCheckPayloadItems(signOutItems, value) }); setValue({}); onClose(); }}>
          {done ? 'Sign out and close the record' : 'Answer every item'}
        </Button>
        <Button size="lg" variant="quiet" onClick={onClose}>Not yet</Button>
      </div>
    </Dialog>
  );
}
