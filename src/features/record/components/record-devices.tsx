import { catalogueItemTypeLabels } from '#shared/schemas/catalogue.ts';
import { formatArea, formatAxes, formatClock, lotWords, unaccountedWords, type RecordView } from '#shared/schemas/record.ts';
import { handoffStatusLabels, retrievalMethodLabels } from '#shared/schemas/specimens.ts';
import { Section, Table } from './table.tsx';

type Props = { view: RecordView };

/** Per catalogue item: opened, deployed, misfired, wasted, left in the patient, and the lots read from labels. */
export function DevicesSection({ view }: Props) {
  const clock = (t: string) => formatClock(t, view.timeZone);
  return (
    <Section id="devices" title="Devices">
      <Table caption="Devices per catalogue item" empty="No device was recorded." numeric={[1, 2, 3, 4, 5]}
        head={['Item', 'Opened', 'Deployed', 'Misfired', 'Wasted', 'In patient', 'Unaccounted', 'Lot (expiry)']}
        rows={view.devices.map((d) => [
          <span><span className="font-bold">{d.description}</span>{d.type && <span className="block text-sm text-muted">{catalogueItemTypeLabels[d.type]}</span>}</span>,
          d.opened, d.deployed, d.misfired, d.wasted, d.inPatient,
          <span className={d.flagged ? 'font-bold text-danger' : undefined}>{unaccountedWords(d)}</span>,
          d.lots.length ? <span data-testid="device-lots">{d.lots.map((l) => <span key={`${l.lot}-${l.expiry}`} className={l.expired ? 'block font-bold text-danger' : 'block'}>{lotWords(l)}</span>)}</span> : '—',
        ])} />
      {view.usages.length > 0 && (
        <>
          <h3 className="text-xl font-bold">Device labels read</h3>
          <Table caption="Device labels read" head={['Read at', 'Item', 'GTIN', 'Lot', 'Serial', 'Expiry', 'Tap']}
            rows={view.usages.map((u) => [
              clock(u.at), u.description, u.gtin ?? '—', u.lot ?? '—', u.serial ?? '—',
              u.expiry ? <span className={u.expired ? 'font-bold text-danger' : undefined}>{u.expiry}{u.expired && ' (expired)'}</span> : '—',
              u.eventLabel ? `${u.eventLabel}${u.eventVoided ? ' (voided)' : ''}` : 'not linked to a tap',
            ])} />
        </>
      )}
    </Section>
  );
}

export function SpecimensSection({ view }: Props) {
  return (
    <Section id="specimens" title="Specimens">
      <Table caption="Specimens" empty="No specimen was recorded." numeric={[3, 5]}
        head={['Specimen', 'Retrieved', 'Method', 'Pieces', 'Size', 'Area', 'Container', 'Hand-off']}
        rows={view.specimens.map((s) => [
          s.label ?? <span className="text-muted">tapped, not listed</span>, s.retrievedAt ? formatClock(s.retrievedAt, view.timeZone) : '—',
          s.retrievalMethod ? retrievalMethodLabels[s.retrievalMethod] : '—', s.pieces ?? '—', formatAxes(s.longMm, s.shortMm), formatArea(s.areaMm2),
          s.containerId ?? '—', s.handoffStatus ? handoffStatusLabels[s.handoffStatus] : '—',
        ])} />
    </Section>
  );
}
