import { createPageDocument } from '#server/services/pdf.ts';
import { catalogueItemTypeLabels } from '#shared/schemas/catalogue.ts';
import {
  bleedWords, checkAnswerWords as answerWords, checkStatusWords as checkWords, formatArea, formatAxes, formatClock, formatDateTime,
  formatMinutes, formatSeconds, haemostasisMethodWords, lotWords, resectionWords, sexWords, unaccountedWords, type RecordView,
} from '#shared/schemas/record.ts';
import { handoffStatusLabels, retrievalMethodLabels } from '#shared/schemas/specimens.ts';
import { facts, heading, paragraph, subheading, table } from './pdf-layout.ts';

const dash = (v: string | number | null | undefined) => (v === null || v === undefined || v === '' ? '—' : String(v));

/**
 * The record as a chart document: the same view the record page draws (both from `buildRecord` on the
 * server), so the same figures. The caution is written at the foot of every page with the patient's
 * two identifiers, as chart pages carry them (common practice).
 */
export async function recordPdf(v: RecordView): Promise<Buffer> {
  const tz = v.timeZone;
  const clock = (t: string | null) => (t ? formatClock(t, tz) : '—');
  const p = v.patient;
  const who = `${p.familyName.toUpperCase()}, ${p.givenName} · Hospital no. ${p.hospitalNumber} · born ${p.birthDate}`;
  const { doc, done, finish } = createPageDocument({
    title: `Procedure record — ${p.familyName.toUpperCase()}, ${p.givenName}`,
    footer: () => `${who} · case ${v.case.id.slice(0, 8)}\n${v.caution}`,
  });

  doc.font('bold').fontSize(18).text('Procedure record');
  doc.font('regular').fontSize(9).fillColor('#3b4452')
    .text(`Built from the event log on ${formatDateTime(v.generatedAt, tz)} (${tz}); the record is ${v.case.status}.`).fillColor('#14181f');

  heading(doc, 'Patient and case');
  facts(doc, [
    ['Patient', `${p.familyName.toUpperCase()}, ${p.givenName}`], ['Hospital no.', p.hospitalNumber],
    ['Born', p.birthDate], ['Sex', sexWords[p.sex]],
    ['Procedure', v.case.procedureLabel], ['Scheduled', formatDateTime(v.case.scheduledAt, tz)],
    ['Indication', v.case.indication], ['Room', v.case.room],
    ['Lesion', `${v.case.lesion.site}, ${v.case.lesion.sizeMm} mm, Paris ${v.case.lesion.paris === 'not_applicable' ? 'not applicable' : v.case.lesion.paris}`], ['Sedation', v.case.sedationLabel],
    ['Endoscopist', v.team.endoscopist.name], ['Nurse', v.team.nurse.name],
  ]);

  heading(doc, 'Time-out and sign-out');
  for (const [title, c] of [['Time-out', v.checks.timeOut], ['Sign-out', v.checks.signOut]] as const) {
    subheading(doc, `${title}: ${checkWords[c.status]}${c.at ? ` at ${clock(c.at)}` : ''}${c.by ? ` by ${c.by.name}` : ''}`);
    if (c.reason) paragraph(doc, `Reason given: ${c.reason}`);
    if (c.items.length) table(doc, ['Check', 'Answer', 'Note'], c.items.map((i) => [i.label, answerWords[i.answer], dash(i.note)]), ['*', 80, 150]);
  }

  heading(doc, 'Phases and durations');
  table(doc, ['Phase', 'Start', 'End', 'Duration'], v.phases.map((ph) => [ph.title, clock(ph.start), ph.end ? clock(ph.end) : 'still running', formatMinutes(ph.minutes)]), ['*', 80, 80, 90], { emptyText: 'No phase was recorded.' });
  if (v.idleGaps.length) paragraph(doc, `Pauses longer than 10 minutes with the scope in: ${v.idleGaps.map((g) => `${clock(g.start)}–${clock(g.end)} (${formatMinutes(g.minutes)})`).join('; ')}.`);

  const c = v.counts;
  heading(doc, 'Counts');
  facts(doc, [
    ['Clips deployed', String(c.clipsDeployed)], ['Clips misfired', String(c.clipsMisfired)],
    ['Loops placed', String(c.loopsPlaced)], ['Devices applied', String(c.devicesApplied)],
    ['Bleeds', `${c.bleeds}${c.bleedsOpen ? ` (${c.bleedsOpen} without haemostasis)` : ''}`], ['Injections', `${c.injections} (${c.injectionMl} ml)`],
    ['Resection', resectionWords(v.resection)], ['Specimens', String(v.specimenSummary.count)],
  ]);

  heading(doc, 'Bleed episodes');
  table(doc, ['#', 'Bleed', 'Severity', 'Haemostasis', 'Time to haemostasis', 'Attempts', 'Clips', 'Coag.', 'Methods'],
    v.bleeds.map((b, i) => [
      String(i + 1), clock(b.start), bleedWords(b),
      b.controlledAt ? clock(b.controlledAt) : b.openAtScopeOut ? 'none by scope out' : 'not yet', formatSeconds(b.secondsToHaemostasis),
      String(b.attempts), String(b.clips), String(b.coagulations), b.methods.map((m) => haemostasisMethodWords[m]).join(', ') || '—',
    ]), [16, 46, 70, 60, 62, 46, 32, 34, '*'], { emptyText: 'No bleed was recorded.' });

  heading(doc, 'Devices');
  table(doc, ['Item', 'Opened', 'Deployed', 'Misfired', 'Wasted', 'In patient', 'Unaccounted', 'Lot (expiry)'],
    v.devices.map((d) => [
      `${d.description}${d.type ? ` (${catalogueItemTypeLabels[d.type]})` : ''}`, String(d.opened), String(d.deployed), String(d.misfired), String(d.wasted), String(d.inPatient),
      unaccountedWords(d),
      d.lots.map(lotWords).join('; ') || '—',
    ]), ['*', 38, 44, 42, 36, 40, 58, 124], { emptyText: 'No device was recorded.' });
  if (v.usages.length) {
    subheading(doc, 'Device labels read');
    table(doc, ['Read at', 'Item', 'GTIN', 'Lot', 'Serial', 'Expiry', 'Tap'], v.usages.map((u) => [
      clock(u.at), u.description, dash(u.gtin), dash(u.lot), dash(u.serial), u.expiry ? `${u.expiry}${u.expired ? ' EXPIRED' : ''}` : '—',
      u.eventLabel ? `${u.eventLabel}${u.eventVoided ? ' (voided)' : ''}` : 'not linked',
    ]), [44, '*', 82, 60, 48, 54, 80]);
  }

  heading(doc, 'Specimens');
  table(doc, ['Specimen', 'Retrieved', 'Method', 'Pieces', 'Size', 'Area', 'Container', 'Hand-off'], v.specimens.map((s) => [
    s.label ?? 'tapped, not listed', clock(s.retrievedAt), s.retrievalMethod ? retrievalMethodLabels[s.retrievalMethod] : '—', dash(s.pieces),
    formatAxes(s.longMm, s.shortMm), formatArea(s.areaMm2), dash(s.containerId), s.handoffStatus ? handoffStatusLabels[s.handoffStatus] : '—',
  ]), ['*', 48, 50, 34, 66, 54, 50, 80], { emptyText: 'No specimen was recorded.' });

  heading(doc, 'Timeline by phase');
  if (v.sections.length === 0) paragraph(doc, 'No event was recorded.', { muted: true });
  for (const s of v.sections) {
    subheading(doc, s.title);
    table(doc, ['Time', 'Event', 'Details', 'Recorded by'], s.entries.map((e) => [clock(e.at), e.label, `${e.detail}${e.amended ? `${e.detail ? ' ' : ''}(details added later)` : ''}` || '—', e.author?.name ?? '—']), [48, 100, '*', 100]);
  }
  if (v.voided.length) {
    subheading(doc, 'Voided taps (kept in the log, left out of the record)');
    table(doc, ['Time', 'Event'], v.voided.map((x) => [clock(x.at), x.label]), [48, '*']);
  }

  heading(doc, 'Who recorded what and when');
  table(doc, ['Person', 'Events', 'First', 'Last', 'Tablets'], v.authorship.map((a) => [a.author.name, String(a.events), clock(a.first), clock(a.last), a.devices.join(', ') || '—']), ['*', 44, 56, 56, 130], { emptyText: 'Nobody has recorded yet.' });

  heading(doc, 'Computed notes');
  if (v.notes.length === 0) paragraph(doc, 'No computed note (they need measured specimens, a loop size or a defect size).', { muted: true });
  for (const n of v.notes) paragraph(doc, `• ${n.text} (${n.caution})`);
  if (v.flags.length) {
    subheading(doc, 'To check before signing');
    for (const f of v.flags) paragraph(doc, `• ${f.message}`);
  }
  if (v.problems.length) {
    subheading(doc, 'Events the record could not use');
    for (const pr of v.problems) paragraph(doc, `• ${pr.message}`, { muted: true });
  }
  doc.moveDown(0.6);
  paragraph(doc, v.caution, { italic: true });

  finish();
  return done;
}
