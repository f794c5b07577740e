import { formatClock, type RecordView } from '#shared/schemas/record.ts';
import { Section, Table } from './table.tsx';

type Props = { view: RecordView };

/** The effective timeline in runs by phase, then the voided taps, then who recorded. */
export function TimelineSection({ view }: Props) {
  const clock = (t: string) => formatClock(t, view.timeZone);
  return (
    <Section id="timeline" title="Timeline by phase">
      {view.sections.length === 0 && <p className="text-muted">No event was recorded.</p>}
      {view.sections.map((s, i) => (
        <div key={`${s.key}-${i}`} className="flex flex-col gap-2">
          <h3 className="text-xl font-bold">{s.title}</h3>
          <Table caption={`Timeline: ${s.title}`} head={['Time', 'Event', 'Details', 'Recorded by']} widths={['7rem', '13rem', '', '12rem']}
            rows={s.entries.map((e) => [
              <span className="tabular-nums">{clock(e.at)}</span>, <span className="font-bold">{e.label}</span>,
              <>{e.detail || '—'}{e.amended && <span className="text-sm text-muted"> (details added later)</span>}</>, e.author?.name ?? '—',
            ])} />
        </div>
      ))}
      {view.voided.length > 0 && (
        <>
          <h3 className="text-xl font-bold">Voided taps (kept in the log, left out of the record)</h3>
          <Table caption="Voided taps" head={['Time', 'Event']} widths={['7rem', '']} rows={view.voided.map((v) => [clock(v.at), v.label])} />
        </>
      )}
    </Section>
  );
}

export function AuthorshipSection({ view }: Props) {
  const clock = (t: string) => formatClock(t, view.timeZone);
  return (
    <Section id="authors" title="Who recorded what and when">
      <Table caption="Who recorded" empty="Nobody has recorded yet." numeric={[1]} head={['Person', 'Events', 'First', 'Last', 'Tablets']}
        rows={view.authorship.map((a) => [a.author.name, a.events, clock(a.first), clock(a.last), a.devices.join(', ') || '—'])} />
    </Section>
  );
}
