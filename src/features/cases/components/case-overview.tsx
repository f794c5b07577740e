import { format, parseISO } from 'date-fns';
import type { ReactNode } from 'react';
import { Link } from 'react-router';
import { procedureTypeLabels, sedationTypeLabels, type CaseSummary } from '#shared/schemas/cases.ts';
import { Banner } from '@/components/ui/banner.tsx';
import { buttonClass } from '@/components/ui/button.tsx';
import { Caution } from '@/components/ui/caution.tsx';
import { Loading } from '@/components/ui/page.tsx';
import { ApiError, errorMessage } from '@/lib/api.ts';
import { useCase } from '../api/get-case.ts';
import { parisLabel } from './paris.ts';
import { CancelCaseButton } from './cancel-case-button.tsx';
import { patientName } from './format.ts';
import { PatientBanner } from './patient-banner.tsx';
import { StatusBadge } from './status-badge.tsx';

function Item({ label, children, wide }: { label: string; children: ReactNode; wide?: boolean }) {
  return (
    <div className={wide ? 'sm:col-span-2' : undefined}>
      <dt className="text-sm font-bold uppercase tracking-wider text-muted">{label}</dt>
      <dd className="mt-0.5 text-lg">{children}</dd>
    </div>
  );
}

/** The case page: who, what, where and who with; the recorder fills its region below. */
export function CaseOverview({ caseId, canRecord }: { caseId: string; canRecord: boolean }) {
  const query = useCase(caseId);
  if (query.isPending) return <Loading label="Opening the case" />;
  if (query.error) {
    const notFound = query.error instanceof ApiError && query.error.isNotFound;
    return <Banner tone="danger" title={notFound ? 'No such case in your unit' : 'The case could not be opened'}>{notFound ? 'Check the link, or find the case on the day list.' : errorMessage(query.error)}</Banner>;
  }
  const c: CaseSummary = query.data;
  const live = c.status === 'scheduled' || c.status === 'recording';
  return (
    <div className="flex flex-col gap-5">
      <PatientBanner patient={c.patient} />
      <div className="flex flex-wrap items-center gap-3">
        <StatusBadge status={c.status} />
        <span className="text-lg">{format(parseISO(c.scheduledAt), "EEEE d MMMM yyyy 'at' HH:mm")} · {c.room.name}</span>
      </div>
      <dl className="grid gap-4 rounded-card border-2 border-line bg-surface p-5 shadow-card sm:grid-cols-2">
        <Item label="Procedure" wide>{procedureTypeLabels[c.procedureType]}</Item>
        <Item label="Indication" wide>{c.indication}</Item>
        <Item label="Lesion site">{c.lesion.site}</Item>
        <Item label="Size">{c.lesion.sizeMm} mm</Item>
        <Item label="Paris type">{parisLabel(c.lesion.paris)}</Item>
        <Item label="Sedation">{sedationTypeLabels[c.sedation]}</Item>
        <Item label="Endoscopist">{c.endoscopist.name}</Item>
        <Item label="Assisting nurse">{c.nurse.name}</Item>
      </dl>
      {canRecord && live && (
        <div className="flex flex-wrap gap-3">
          <Link to={`/cases/${c.id}/capture`} className={buttonClass('primary', 'xl', 'min-w-72')}>
            {c.status === 'recording' ? 'Back to the recorder' : 'Open the recorder'}
          </Link>
          {c.status === 'scheduled' && <CancelCaseButton caseId={c.id} patientLabel={patientName(c.patient)} />}
        </div>
      )}
      {/* The recorder (src/features/capture) renders its summary here. */}
      <section data-region="recorder" aria-label="Recorder" />
      <Caution />
    </div>
  );
}
