import { useState } from 'react';
import { formatArea, formatAxes, formatClock, type RecordView } from '#shared/schemas/record.ts';
import {
  createSpecimenSchema, handoffStatuses, handoffStatusLabels, retrievalMethodLabels, type HandoffStatus, type Specimen,
} from '#shared/schemas/specimens.ts';
import { retrievalMethods } from '#shared/schemas/events.ts';
import { Banner } from '@/components/ui/banner.tsx';
import { Button, buttonClass } from '@/components/ui/button.tsx';
import { Field, Input, Select } from '@/components/ui/field.tsx';
import { Loading } from '@/components/ui/page.tsx';
import { useToast } from '@/components/ui/toast.tsx';
import { ApiError, errorMessage } from '@/lib/api.ts';
import { labelPdfUrl, useAddSpecimen, useChangeSpecimen, useSpecimens } from '../api/specimens.ts';

type TappedRow = RecordView['specimens'][number];
type Props = {
  caseId: string;
  canWrite: boolean;
  /** The record's retrievals tapped in the room and not listed yet (its rows without an id). */
  tapped?: TappedRow[];
  timeZone?: string;
};

const labelAt = (n: number) => String.fromCharCode(65 + (n % 26));

/** The case's specimens: how each came out, its size, its container label and where it is on its way to the laboratory. */
export function SpecimenList({ caseId, canWrite, tapped = [], timeZone = 'UTC' }: Props) {
  const query = useSpecimens(caseId);
  if (query.isPending) return <Loading label="Loading the specimens" />;
  if (query.error) return <Banner tone="danger" title="The specimens could not be read">{errorMessage(query.error)}</Banner>;
  const nextLabel = labelAt(query.data.length);
  return (
    <div className="flex flex-col gap-6">
      {query.data.length === 0 && <p className="text-lg text-muted">No specimen is listed yet.</p>}
      <ul className="grid gap-4 lg:grid-cols-2" aria-label="Specimens">
        {query.data.map((s) => <SpecimenCard key={s.id} caseId={caseId} specimen={s} canWrite={canWrite} />)}
      </ul>
      {tapped.length > 0 && <TappedRetrievals caseId={caseId} rows={tapped} canWrite={canWrite} nextLabel={nextLabel} timeZone={timeZone} />}
      {canWrite && <AddSpecimen caseId={caseId} nextLabel={nextLabel} />}
    </div>
  );
}

/**
 * Specimens tapped out in the room that the list does not hold yet. Listing one keeps the id its tap
 * made, so the record joins the two (one specimen, with the tap's time on its label), not two rows.
 */
function TappedRetrievals({ caseId, rows, canWrite, nextLabel, timeZone }: { caseId: string; rows: TappedRow[]; canWrite: boolean; nextLabel: string; timeZone: string }) {
  const add = useAddSpecimen(caseId);
  const notify = useToast();
  const list = (r: TappedRow & { tapSpecimenId: string }) => add.mutate(
    { id: r.tapSpecimenId, label: nextLabel, retrievalMethod: r.retrievalMethod, pieces: r.pieces, longMm: r.longMm, shortMm: r.shortMm },
    { onSuccess: (s) => notify(`Specimen ${s.label} listed`), onError: (e) => notify(errorMessage(e), 'danger') },
  );
  return (
    <section className="flex flex-col gap-3" aria-label="Tapped in the room, not listed">
      <h3 className="text-xl font-bold">Tapped in the room, not listed</h3>
      <ul className="flex flex-col gap-2">
        {rows.map((r, i) => {
          const { tapSpecimenId } = r;
          return (
            <li key={tapSpecimenId ?? `tap-${i}`} className="flex flex-wrap items-center justify-between gap-3 rounded-control border-2 border-line-strong bg-sunken p-3">
              <span>
                <span className="font-bold">Out at {r.retrievedAt ? formatClock(r.retrievedAt, timeZone) : '—'}</span>
                {' · '}{r.retrievalMethod ? retrievalMethodLabels[r.retrievalMethod] : 'method not said'}
                {r.pieces != null && ` · ${r.pieces} ${r.pieces === 1 ? 'piece' : 'pieces'}`}
                {r.longMm != null && ` · ${formatAxes(r.longMm, r.shortMm)}`}
              </span>
              {canWrite && (tapSpecimenId
                ? <Button busy={add.isPending} onClick={() => list({ ...r, tapSpecimenId })}>List it as specimen {nextLabel}</Button>
                : <span className="text-sm text-muted">Tapped without a specimen id: list it with the form below.</span>)}
            </li>
          );
        })}
      </ul>
    </section>
  );
}

function SpecimenCard({ caseId, specimen: s, canWrite }: { caseId: string; specimen: Specimen; canWrite: boolean }) {
  const change = useChangeSpecimen(caseId);
  const notify = useToast();
  const [container, setContainer] = useState(s.containerId ?? '');
  const save = (input: Parameters<typeof change.mutate>[0]['input'], done: string) =>
    change.mutate({ id: s.id, input }, { onSuccess: () => notify(done), onError: (e) => notify(errorMessage(e), 'danger') });
  return (
    <li className="flex flex-col gap-3 rounded-card border-2 border-line bg-surface p-4 shadow-card" aria-label={`Specimen ${s.label}`}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="text-2xl font-bold">Specimen {s.label}</h3>
        <span className="rounded-control border-2 border-line-strong px-2 py-0.5 text-sm font-bold" data-testid="handoff">{handoffStatusLabels[s.handoffStatus]}</span>
      </div>
      <dl className="grid grid-cols-2 gap-x-4 gap-y-2">
        <div><dt className="text-sm font-bold text-muted">Retrieved with</dt><dd>{s.retrievalMethod ? retrievalMethodLabels[s.retrievalMethod] : '—'}</dd></div>
        <div><dt className="text-sm font-bold text-muted">Pieces</dt><dd>{s.pieces ?? '—'}</dd></div>
        <div><dt className="text-sm font-bold text-muted">Size</dt><dd>{formatAxes(s.longMm, s.shortMm)}</dd></div>
        <div><dt className="text-sm font-bold text-muted">Area (computed)</dt><dd>{formatArea(s.areaMm2)}</dd></div>
      </dl>
      {canWrite && (
        <div className="flex flex-wrap items-end gap-2">
          <Field label="Container number" className="min-w-40 flex-1">
            {(c) => <Input {...c} value={container} maxLength={64} onChange={(e) => setContainer(e.target.value)} />}
          </Field>
          <Button disabled={container === (s.containerId ?? '')} busy={change.isPending}
            onClick={() => save({ containerId: container, ...(s.handoffStatus === 'pending' && container ? { handoffStatus: 'labelled' } : {}) }, 'Container saved')}>Save container</Button>
        </div>
      )}
      {canWrite && (
          <Field label="Hand-off">
            {(c) => (
              <Select {...c} value={s.handoffStatus} onChange={(e) => save({ handoffStatus: e.target.value as HandoffStatus }, 'Hand-off updated')}>
                {handoffStatuses.map((h) => <option key={h} value={h}>{handoffStatusLabels[h]}</option>)}
              </Select>
            )}
          </Field>
      )}
      <a className={buttonClass('secondary', 'md', 'self-start')} href={labelPdfUrl(caseId, s.id)} target="_blank" rel="noreferrer">Print the container label</a>
    </li>
  );
}

type Draft = { label: string; retrievalMethod: string; pieces: string; longMm: string; shortMm: string };
const num = (s: string) => (s.trim() === '' ? null : Number(s));

function AddSpecimen({ caseId, nextLabel }: { caseId: string; nextLabel: string }) {
  const add = useAddSpecimen(caseId);
  const notify = useToast();
  const empty: Draft = { label: nextLabel, retrievalMethod: '', pieces: '', longMm: '', shortMm: '' };
  const [d, setD] = useState<Draft>(empty);
  const [errors, setErrors] = useState<Record<string, string>>({});
  // A specimen listed elsewhere (a tapped one, another tablet) moves the suggested label on, unless it was typed over.
  const [suggested, setSuggested] = useState(nextLabel);
  if (suggested !== nextLabel) {
    setSuggested(nextLabel);
    if (d.label === suggested) setD((x) => ({ ...x, label: nextLabel }));
  }
  const submit = () => {
    const parsed = createSpecimenSchema.safeParse({
      label: d.label, retrievalMethod: d.retrievalMethod || null, pieces: num(d.pieces), longMm: num(d.longMm), shortMm: num(d.shortMm),
    });
    if (!parsed.success) {
      setErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0] ?? 'label'), i.message])));
      return;
    }
    setErrors({});
    add.mutate(parsed.data, {
      onSuccess: (s) => { notify(`Specimen ${s.label} listed`); setD({ ...empty, label: String.fromCharCode(s.label.charCodeAt(0) + 1) }); },
      onError: (e) => { if (e instanceof ApiError) setErrors(e.fieldErrors()); notify(errorMessage(e), 'danger'); },
    });
  };
  const set = (k: keyof Draft) => (e: { target: { value: string } }) => setD((x) => ({ ...x, [k]: e.target.value }));
  return (
    <form className="flex flex-col gap-4 rounded-card border-2 border-line bg-surface p-4" aria-label="List a specimen" onSubmit={(e) => { e.preventDefault(); submit(); }}>
      <h3 className="text-xl font-bold">List a specimen</h3>
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-5">
        <Field label="Label" required error={errors.label}>{(c) => <Input {...c} value={d.label} maxLength={60} onChange={set('label')} />}</Field>
        <Field label="Retrieved with" error={errors.retrievalMethod}>
          {(c) => (
            <Select {...c} value={d.retrievalMethod} onChange={set('retrievalMethod')}>
              <option value="">Not said</option>
              {retrievalMethods.map((m) => <option key={m} value={m}>{retrievalMethodLabels[m]}</option>)}
            </Select>
          )}
        </Field>
        <Field label="Pieces" error={errors.pieces}>{(c) => <Input {...c} inputMode="numeric" value={d.pieces} onChange={set('pieces')} />}</Field>
        <Field label="Long axis, mm" error={errors.longMm}>{(c) => <Input {...c} inputMode="decimal" value={d.longMm} onChange={set('longMm')} />}</Field>
        <Field label="Short axis, mm" error={errors.shortMm}>{(c) => <Input {...c} inputMode="decimal" value={d.shortMm} onChange={set('shortMm')} />}</Field>
      </div>
      <div><Button type="submit" variant="primary" size="lg" busy={add.isPending}>List the specimen</Button></div>
    </form>
  );
}
