import { Link } from 'react-router';
import { formatDateTime, sexWords, type RecordView } from '#shared/schemas/record.ts';
import { Banner } from '@/components/ui/banner.tsx';
import { buttonClass } from '@/components/ui/button.tsx';
import { Loading } from '@/components/ui/page.tsx';
import { ApiError, errorMessage } from '@/lib/api.ts';
import { recordPdfUrl, useRecord } from '../api/get-record.ts';
import { DevicesSection, SpecimensSection } from './record-devices.tsx';
import { BleedsSection, ChecksSection, FiguresSection } from './record-summary.tsx';
import { AuthorshipSection, TimelineSection } from './record-timeline.tsx';
import { Facts, Section } from './table.tsx';

const index = [['checks', 'Checks'], ['figures', 'Phases and counts'], ['bleeds', 'Bleeds'], ['devices', 'Devices'], ['specimens', 'Specimens'], ['timeline', 'Timeline'], ['authors', 'Who recorded'], ['notes', 'Computed notes']] as const;

/**
 * The record of a case, as the server built it from the event log: the same answer the PDF is drawn
 * from, so the two show the same figures.
 */
export function RecordPage({ caseId }: { caseId: string }) {
  const query = useRecord(caseId);
  if (query.isPending) return <Loading label="Building the record" />;
  if (query.error) {
    const notFound = query.error instanceof ApiError && query.error.isNotFound;
    return <Banner tone="danger" title={notFound ? 'No such case in your unit' : 'The record could not be opened'}>{notFound ? 'Check the link, or find the case on the day list.' : errorMessage(query.error)}</Banner>;
  }
  return <RecordBody view={query.data} />;
}

export function RecordBody({ view }: { view: RecordView }) {
  const p = view.patient;
  const c = view.case;
  return (
    <article className="flex flex-col gap-8" aria-label="Procedure record">
      <header className="flex flex-col gap-4">
        <div className="flex flex-wrap items-end justify-between gap-4">
          <div>
            <p className="text-sm font-bold uppercase tracking-wide text-muted">Procedure record</p>
            <h1 className="text-3xl font-bold" data-testid="record-patient">{p.familyName.toUpperCase()}, {p.givenName}</h1>
            <p className="text-lg">Hospital no. <span className="font-bold">{p.hospitalNumber}</span> · born {p.birthDate} · {sexWords[p.sex]}</p>
          </div>
          <div className="flex flex-wrap gap-2">
            <Link to={`/cases/${c.id}`} className={buttonClass('secondary', 'md')}>Case page</Link>
            <Link to={`/cases/${c.id}/specimens`} className={buttonClass('secondary', 'md')}>Specimens</Link>
            <a href={recordPdfUrl(c.id)} target="_blank" rel="noreferrer" className={buttonClass('primary', 'md')}>Open the PDF</a>
          </div>
        </div>
        <Facts items={[
          ['Procedure', c.procedureLabel], ['Scheduled', formatDateTime(c.scheduledAt, view.timeZone)],
          ['Indication', c.indication], ['Room', c.room],
          ['Lesion', `${c.lesion.site}, ${c.lesion.sizeMm} mm, Paris ${c.lesion.paris === 'not_applicable' ? 'not applicable' : c.lesion.paris}`], ['Sedation', c.sedationLabel],
          ['Endoscopist', view.team.endoscopist.name], ['Nurse', view.team.nurse.name],
        ]} />
        <p className="text-sm text-muted">Built from the event log on {formatDateTime(view.generatedAt, view.timeZone)} ({view.timeZone}); the record is {c.status}.</p>
        <nav aria-label="Parts of the record" className="flex flex-wrap gap-2">
          {index.map(([id, title]) => <a key={id} href={`#${id}`} className="inline-flex min-h-touch items-center rounded-control border-2 border-line px-3 font-bold no-underline hover:bg-sunken">{title}</a>)}
        </nav>
        {view.flags.length > 0 && (
          <Banner tone="caution" title="To check before signing" role="note">
            <ul className="list-disc pl-5">{view.flags.map((f) => <li key={`${f.code}-${f.message}`}>{f.message}</li>)}</ul>
          </Banner>
        )}
      </header>
      <ChecksSection view={view} />
      <FiguresSection view={view} />
      <BleedsSection view={view} />
      <DevicesSection view={view} />
      <SpecimensSection view={view} />
      <TimelineSection view={view} />
      <AuthorshipSection view={view} />
      <Section id="notes" title="Computed notes">
        {view.notes.length === 0
          ? <p className="text-muted">No computed note (they need measured specimens, a loop size or a defect size).</p>
          : <ul className="flex flex-col gap-2">{view.notes.map((n) => <li key={n.kind} className="rounded-control border-2 border-dashed border-caution-line bg-caution-soft p-3">{n.text} <span className="text-sm text-caution">({n.caution})</span></li>)}</ul>}
        {view.problems.length > 0 && (
          <Banner tone="info" title="Events the record could not use">
            <ul className="list-disc pl-5">{view.problems.map((x, i) => <li key={i}>{x.message}</li>)}</ul>
          </Banner>
        )}
      </Section>
      <aside role="note" aria-label="Caution" data-caution className="flex gap-3 rounded-control border-2 border-dashed border-caution-line bg-caution-soft px-4 py-3 text-caution">
        <span aria-hidden className="font-bold">△</span>
        <p>{view.caution}</p>
      </aside>
    </article>
  );
}
