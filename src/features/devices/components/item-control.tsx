import { useEffect, useState, type ComponentType } from 'react';
import { v7 as uuidv7 } from 'uuid';
import type { CatalogueItem } from '#shared/schemas/catalogue.ts';
import { Button } from '@/components/ui/button.tsx';
import { Select } from '@/components/ui/field.tsx';
import { useCatalogue } from '@/features/catalogue/api/catalogue.ts';
import { flushUsages, onUsageResult, queueUsage, type SendResult } from '../api/usage-outbox.ts';
import { itemName as nameOf } from '../scan.ts';
import { ScanField, type ConfirmedScan } from './scan-field.tsx';

/** What the capture screen hands a catalogue-item control; `eventId` ties the scan to its tap when known. */
export type ItemControlProps = { value: string; onChange: (itemId: string) => void; label: string; eventId?: string };

/** The item's name, or its id when the catalogue does not know it. */
export const itemName = (item: CatalogueItem | undefined, id: string) => (item ? nameOf(item) : id);

/**
 * The devices feature's item control for the capture screen's detail sheet: the tap is already
 * recorded; a scan confirmed here is kept on the tablet and sent as a device usage (lot, expiry) for the
 * case, and names the item on the event through the sheet's own amendment. With `eventId` the usage is
 * linked to that tap; while the tap is still on its way to the server the scan waits on the tablet (shown
 * as waiting) and is sent again, so the tap itself never waits on the scan.
 */
export function captureItemControl(caseId: string): ComponentType<ItemControlProps> {
  return function CaptureItemControl({ value, onChange, label, eventId }: ItemControlProps) {
    const catalogue = useCatalogue().data ?? [];
    const [open, setOpen] = useState(!value);
    const [result, setResult] = useState<SendResult | null>(null);
    const [busy, setBusy] = useState(false);
    const [usageId, setUsageId] = useState<string | null>(null);
    const current = catalogue.find((c) => c.id === value);

    // A later try of this control's last scan (the tap reached the server) updates what it says.
    useEffect(() => (usageId ? onUsageResult((id, r) => { if (id === usageId) { setResult(r); if (r.status === 'refused') setOpen(true); } }) : undefined), [usageId]);
    // Scans left waiting by an earlier screen or session go out while the recorder is open.
    useEffect(() => void flushUsages(true), []);

    const confirm = async (scan: ConfirmedScan) => {
      // The item goes to the sheet at once (its "Save details" may come before the server answers); the label follows.
      if (scan.item) onChange(scan.item.id);
      setOpen(false);
      setBusy(true);
      const id = uuidv7();
      setUsageId(id);
      const sent = await queueUsage(caseId, { id, eventId: eventId ?? null, itemId: scan.item?.id ?? null, rawScan: scan.raw }).finally(() => setBusy(false));
      setResult(sent);
      if (sent.status === 'refused') setOpen(true);
    };

    return (
      <div className="flex flex-col gap-2" role="group" aria-label={label}>
        {value && <p className="text-lg font-bold" data-testid="chosen-item"><span className="text-sm text-muted">Item: </span>{itemName(current, value)}</p>}
        {result?.status === 'stored' && <p role="status" className="font-bold text-ok">Label recorded{result.usage.lot ? `: lot ${result.usage.lot}` : ''}.</p>}
        {result?.status === 'waiting' && <p role="status" className="font-bold text-caution">Label kept on this tablet{eventId ? ' for this tap' : ''}; it is sent when the server can take it.</p>}
        {result?.status === 'refused' && <p role="alert" className="font-bold text-danger">The server refused the label: {result.reason}</p>}
        {open ? (
          <>
            <ScanField catalogue={catalogue} onConfirm={(s) => void confirm(s)} busy={busy} compact />
            <details className="rounded-control border-2 border-line p-2">
              <summary className="min-h-touch cursor-pointer content-center font-bold">No code to scan: choose the item</summary>
              <Select aria-label="Catalogue item" value={value} onChange={(e) => { onChange(e.target.value); if (e.target.value) setOpen(false); }}>
                <option value="">Choose…</option>
                {catalogue.filter((c) => c.active).map((c) => <option key={c.id} value={c.id}>{itemName(c, c.id)}</option>)}
              </Select>
            </details>
          </>
        ) : <Button onClick={() => setOpen(true)}>Scan another label</Button>}
      </div>
    );
  };
}
