import { useState } from 'react';
import { Banner } from '@/components/ui/banner.tsx';
import { Button } from '@/components/ui/button.tsx';
import { Dialog } from '@/components/ui/dialog.tsx';
import { Field, Textarea } from '@/components/ui/field.tsx';
import { useToast } from '@/components/ui/toast.tsx';
import { errorMessage } from '@/lib/api.ts';
import { useCancelCase } from '../api/cancel-case.ts';

export function CancelCaseButton({ caseId, patientLabel }: { caseId: string; patientLabel: string }) {
  const [open, setOpen] = useState(false);
  const [reason, setReason] = useState('');
  const cancel = useCancelCase();
  const notify = useToast();
  const confirm = () =>
    cancel.mutate({ id: caseId, reason: reason.trim() || undefined }, { onSuccess: () => { setOpen(false); notify('Booking cancelled'); } });
  return (
    <>
      <Button variant="danger" size="lg" onClick={() => setOpen(true)}>Cancel the booking</Button>
      <Dialog open={open} onClose={() => setOpen(false)} title="Cancel this booking?">
        <p className="mb-4">The case for <strong>{patientLabel}</strong> stays on the list as cancelled. This cannot be undone.</p>
        <Field label="Reason (optional)" className="mb-4">
          {(p) => <Textarea {...p} value={reason} onChange={(e) => setReason(e.target.value)} rows={2} maxLength={500} />}
        </Field>
        {cancel.error && <Banner tone="danger" className="mb-4">{errorMessage(cancel.error)}</Banner>}
        <div className="flex flex-wrap gap-3">
          <Button variant="danger" size="lg" busy={cancel.isPending} onClick={confirm}>Yes, cancel it</Button>
          <Button size="lg" onClick={() => setOpen(false)}>Keep it</Button>
        </div>
      </Dialog>
    </>
  );
}
