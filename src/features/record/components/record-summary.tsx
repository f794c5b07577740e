import {
  bleedWords, checkAnswerWords, checkStatusWords, formatClock, formatMinutes, formatSeconds, haemostasisMethodWords, resectionWords,
  type RecordView,
} from '#shared/schemas/record.ts';
import { cn } from '@/lib/cn.ts';
import { Section, Table, Tiles } from './table.tsx';

type Props = { view: RecordView };
const clockOf = (tz: string) => (t: string | null) => (t ? formatClock(t, tz) : '—');

/** Time-out and sign-out: done, skipped (with the reason) or not recorded, and each answer. */
export function ChecksSection({ view }: Props) {
  const clock = clockOf(view.timeZone);
  return (
    <Section id="checks" title="Time-out and sign-out">
      <div className="grid gap-4 lg:grid-cols-2">
        {([['Time-out', view.checks.timeOut], ['Sign-out', view.checks.signOut]] as const).map(([title, c]) => (
          <div key={title} className="flex flex-col gap-2 rounded-card border-2 border-line bg-surface p-4" data-testid={`check-${title}`}>
            <p className="text-lg">
              <span className="font-bold">{title}: </span>
              <span className={cn('font-bold', c.status === 'present' ? 'text-ok' : 'text-danger')}>{checkStatusWords[c.status]}</span>
              {c.at && ` at ${clock(c.at)}`}{c.by && ` by ${c.by.name}`}
            </p>
            {c.reason && <p>Reason given: {c.reason}</p>}
            {c.items.length > 0 && (
              <ul className="flex flex-col gap-1">
                {c.items.map((i) => (
                  <li key={i.key} className="flex flex-wrap gap-x-2">
                    <span className={cn('font-bold', i.answer === 'no' && 'text-danger')}>{checkAnswerWords[i.answer]}</span>
                    <span>{i.label}</span>
                    {i.note && <span className="text-muted">— {i.note}</span>}
                  </li>
                ))}
              </ul>
            )}
          </div>
        ))}
      </div>
    </Section>
  );
}

/** Phases with their durations, the counts, and the pauses. */
export function FiguresSection({ view }: Props) {
  const clock = clockOf(view.timeZone);
  const c = view.counts;
  return (
    <Section id="figures" title="Phases and counts">
      <Table caption="Phases and durations" head={['Phase', 'Start', 'End', 'Duration']} numeric={[3]} empty="No phase was recorded."
        rows={view.phases.map((p) => [p.title, clock(p.start), p.end ? clock(p.end) : 'still running', formatMinutes(p.minutes)])} />
      {view.idleGaps.length > 0 && (
        <p>Pauses longer than 10 minutes with the scope in: {view.idleGaps.map((g) => `${clock(g.start)}–${clock(g.end)} (${formatMinutes(g.minutes)})`).join('; ')}.</p>
      )}
      <Tiles items={[
        { label: 'Clips deployed', value: c.clipsDeployed, testId: 'count-clips-deployed' },
        { label: 'Clips misfired', value: c.clipsMisfired, testId: 'count-clips-misfired' },
        { label: 'Loops placed', value: c.loopsPlaced, testId: 'count-loops' },
        { label: 'Devices applied', value: c.devicesApplied },
        { label: c.bleedsOpen ? `Bleeds (${c.bleedsOpen} without haemostasis)` : 'Bleeds', value: c.bleeds, alert: c.bleedsOpen > 0 },
        { label: `Injections (${c.injectionMl} ml)`, value: c.injections },
        { label: 'Specimens', value: view.specimenSummary.count },
        { label: 'Resection', value: <span className="text-xl">{resectionWords(view.resection)}</span> },
      ]} />
    </Section>
  );
}

/** Each bleed from its start to the haemostasis that held, with what it took. */
export function BleedsSection({ view }: Props) {
  const clock = clockOf(view.timeZone);
  return (
    <Section id="bleeds" title="Bleed episodes">
      <Table caption="Bleed episodes" empty="No bleed was recorded." numeric={[5, 6, 7]}
        head={['#', 'Bleed', 'Severity', 'Haemostasis', 'Time to haemostasis', 'Attempts', 'Clips', 'Coagulation', 'Methods']}
        rows={view.bleeds.map((b, i) => [
          i + 1, clock(b.start), bleedWords(b),
          b.controlledAt ? clock(b.controlledAt) : <span className="font-bold text-danger">{b.openAtScopeOut ? 'none by scope out' : 'not yet'}</span>,
          <span data-testid="bleed-time">{formatSeconds(b.secondsToHaemostasis)}</span>, b.attempts, b.clips, b.coagulations,
          b.methods.map((m) => haemostasisMethodWords[m]).join(', ') || '—',
        ])} />
    </Section>
  );
}
