/**
 * Invented demo timelines for the three past cases of the demo unit (PRODUCT.md, Demo scenario): full event
 * logs as a tablet would have sent them, in the order they were tapped. Every clinical detail here is made
 * up for the demo; none describes a real patient or procedure.
 */
import { v7 as uuidv7 } from 'uuid';
import type { EventKind, NewEvent, PayloadOf } from '#shared/schemas/events.ts';

type Kind = 'eftr' | 'esd' | 'emr';
type ItemKey = 'clip' | 'loop' | 'otsc' | 'needle';

export type TimelineContext = {
  caseIds: Record<Kind, string>;
  startAt: Record<Kind, Date>;
  nurseId: string;
  endoscopistId: string;
  deviceId: string;
  items: Record<ItemKey, string>;
};

/** A tablet synced a moment before the case: no offset, a round trip of a few tens of ms. */
const OFFSET_UNCERTAINTY_MS = 14;

type Who = 'nurse' | 'endoscopist';

/** Writes one case's log: `at(minutes, kind, payload)` taps an event that many minutes after the start. */
function recorder(caseId: string, start: Date, ctx: TimelineContext) {
  const list: NewEvent[] = [];
  const at = <K extends EventKind>(minutes: number, kind: K, payload: PayloadOf<K>, who: Who = 'nurse'): string => {
    const ms = start.getTime() + Math.round(minutes * 60_000);
    const id = uuidv7({ msecs: ms });
    list.push({
      id, caseId, deviceTime: new Date(ms).toISOString(), offsetMs: 0, offsetUncertaintyMs: OFFSET_UNCERTAINTY_MS,
      author: who === 'nurse' ? ctx.nurseId : ctx.endoscopistId, device: ctx.deviceId, kind, payload,
    } as NewEvent);
    return id;
  };
  return { at, list };
}

const timeOutItems: PayloadOf<'time_out'>['items'] = [
  { key: 'identity', label: 'Patient identity confirmed by two identifiers', answer: 'yes' },
  { key: 'procedure_site', label: 'Procedure and site confirmed', answer: 'yes' },
  { key: 'consent', label: 'Consent signed', answer: 'yes' },
  { key: 'allergies', label: 'Allergies reviewed', answer: 'yes', note: 'none known' },
  { key: 'anticoagulants', label: 'Anticoagulants held as planned', answer: 'yes' },
  { key: 'equipment', label: 'Equipment and electrosurgical unit checked', answer: 'yes' },
  { key: 'co2', label: 'CO₂ insufflation on', answer: 'yes' },
  { key: 'specimen_plan', label: 'Specimen plan agreed', answer: 'yes' },
];
const signOutItems: PayloadOf<'sign_out'>['items'] = [
  { key: 'specimens_labelled', label: 'Specimens labelled', answer: 'yes' },
  { key: 'counts_reconciled', label: 'Device counts reconciled', answer: 'yes' },
  { key: 'equipment_ok', label: 'No equipment problems to report', answer: 'yes' },
  { key: 'handover', label: 'Handover to recovery given', answer: 'yes' },
];

/** (a) Full-thickness resection of a 28 mm submucosal tumour of the gastric fundus: two bleeds; closed with an over-the-scope clip, clips and a loop. */
function eftr(ctx: TimelineContext): NewEvent[] {
  const { at, list } = recorder(ctx.caseIds.eftr, ctx.startAt.eftr, ctx);
  const { clip, loop, otsc, needle } = ctx.items;
  at(0, 'patient_in', {});
  at(3, 'time_out', { items: timeOutItems });
  at(5, 'sedation_start', { type: 'general_anaesthesia' });
  at(7, 'medication', { drug: 'co-amoxiclav', dose: 1.2, unit: 'g', route: 'iv' });
  at(11, 'scope_in', {});
  at(12, 'esu_setting', { modeLabel: 'pulsed cut 2', effect: 2, watts: 40 });
  at(14, 'marking', {});
  at(15.5, 'device_opened', { itemId: needle, quantity: 1 });
  at(17, 'injection', { agent: 'saline with adrenaline 1:100,000', volumeMl: 6, dye: 'indigo carmine' });
  at(19, 'injection', { agent: 'saline with adrenaline 1:100,000', volumeMl: 4, dye: 'indigo carmine' });
  at(21, 'device_wasted', { itemId: needle, quantity: 1, reason: 'needle would not retract after the second injection; replaced' });
  at(22, 'incision', {});
  at(30, 'dissection', {});
  const bleed1 = at(38, 'bleed', { severity: 'ooze', vesselMm: 1 });
  at(39, 'coagulation', { target: 'oozing submucosal vessel' });
  at(40, 'haemostasis', { method: 'coagulation_forceps', achieved: true, bleedId: bleed1 });
  at(44, 'image', { caption: 'Tumour base exposed' }, 'endoscopist');
  at(52, 'remark', { text: 'Full-thickness incision begun as planned' }, 'endoscopist');
  const bleed2 = at(58, 'bleed', { severity: 'spurting', vesselMm: 2 });
  at(58.5, 'haemostasis', { method: 'coagulation_forceps', achieved: false, bleedId: bleed2 });
  at(59, 'device_opened', { itemId: clip, quantity: 1 });
  at(59.5, 'clip_fired', { itemId: clip, outcome: 'deployed', purpose: 'haemostasis' });
  at(60.5, 'haemostasis', { method: 'clip', achieved: true, bleedId: bleed2 });
  at(66, 'resection_complete', { enBloc: true, pieces: 1 });
  at(67, 'remark', { text: 'Full-thickness defect about 30 mm; omentum seen, no bleeding' }, 'endoscopist');
  at(69, 'scope_out', {});
  at(70, 'specimen_retrieved', { method: 'net', pieces: 1, longMm: 32, shortMm: 29 });
  at(71, 'specimen_labelled', { containerId: 'A1' });
  at(72, 'device_opened', { itemId: otsc, quantity: 1 });
  at(75, 'scope_in', {});
  at(76, 'closure_start', {});
  at(78, 'device_applied', { itemId: otsc });
  at(80, 'device_opened', { itemId: clip, quantity: 4 });
  at(81, 'clip_fired', { itemId: clip, outcome: 'deployed', purpose: 'closure' });
  at(82, 'clip_fired', { itemId: clip, outcome: 'misfired', purpose: 'closure' });
  at(83, 'clip_fired', { itemId: clip, outcome: 'deployed', purpose: 'closure' });
  at(84, 'clip_fired', { itemId: clip, outcome: 'deployed', purpose: 'closure' });
  at(85, 'device_opened', { itemId: loop, quantity: 1 });
  at(87, 'loop_placed', { itemId: loop, sizeMm: 30 });
  const wrong = at(88, 'remark', { text: 'Loop closed around clips' });
  at(88.5, 'void', { targetId: wrong, reason: 'tapped on the wrong case note; the loop was tightened at 87' });
  at(90, 'closure_complete', { method: 'over-the-scope clip, clips and loop', complete: 'full' });
  at(91, 'image', { caption: 'Closed defect' }, 'endoscopist');
  at(93, 'scope_out', {});
  at(95, 'sign_out', { items: signOutItems });
  at(97, 'patient_out', {});
  return list;
}

/** (b) ESD of a 32 mm antral lesion, en bloc; prophylactic coagulation, partial closure with clips. */
function esd(ctx: TimelineContext): NewEvent[] {
  const { at, list } = recorder(ctx.caseIds.esd, ctx.startAt.esd, ctx);
  const { clip, needle } = ctx.items;
  at(0, 'patient_in', {});
  at(2, 'time_out', { items: timeOutItems });
  at(4, 'sedation_start', { type: 'deep' });
  at(4.5, 'medication', { drug: 'propofol', dose: 80, unit: 'mg', route: 'iv' });
  at(8, 'scope_in', {});
  at(9, 'esu_setting', { modeLabel: 'dry cut 3', effect: 3, watts: 50 });
  at(11, 'marking', {});
  at(13, 'device_opened', { itemId: needle, quantity: 1 });
  const firstInjection = at(15, 'injection', { agent: 'succinylated gelatin', volumeMl: 10, dye: 'indigo carmine' });
  at(16, 'amend', { targetId: firstInjection, fields: { volumeMl: 12 } });
  at(18, 'incision', {});
  at(24, 'injection', { agent: 'succinylated gelatin', volumeMl: 5, dye: 'indigo carmine' });
  at(26, 'dissection', {});
  at(33, 'image', { caption: 'Submucosal plane' }, 'endoscopist');
  const ooze = at(41, 'bleed', { severity: 'ooze' });
  at(42, 'coagulation', { target: 'submucosal vessel' });
  at(43, 'haemostasis', { method: 'coagulation_forceps', achieved: true, bleedId: ooze });
  at(49, 'injection', { agent: 'succinylated gelatin', volumeMl: 4, dye: 'indigo carmine' });
  at(51, 'dissection', {});
  at(62, 'image', { caption: 'Dissection under the lesion, two thirds done' }, 'endoscopist');
  at(71, 'remark', { text: 'Final attachment at the pyloric side' }, 'endoscopist');
  at(79, 'resection_complete', { enBloc: true, pieces: 1 });
  at(80, 'scope_out', {});
  at(81, 'specimen_retrieved', { method: 'net', pieces: 1, longMm: 38, shortMm: 31 });
  at(82, 'specimen_labelled', { containerId: 'B1' });
  at(84, 'scope_in', {});
  at(86, 'coagulation', { target: 'visible vessels in the defect (prophylactic)' });
  at(88, 'image', { caption: 'Resection bed after coagulation' }, 'endoscopist');
  at(89, 'device_opened', { itemId: clip, quantity: 4 });
  at(90, 'closure_start', {});
  at(91, 'clip_fired', { itemId: clip, outcome: 'deployed', purpose: 'closure' });
  at(92, 'clip_fired', { itemId: clip, outcome: 'deployed', purpose: 'closure' });
  at(93, 'clip_fired', { itemId: clip, outcome: 'misfired', purpose: 'closure' });
  at(94, 'clip_fired', { itemId: clip, outcome: 'deployed', purpose: 'closure' });
  at(96, 'closure_complete', { method: 'clips', complete: 'partial' });
  at(98, 'scope_out', {});
  at(99, 'device_wasted', { itemId: needle, quantity: 1, reason: 'single-use needle discarded after use' });
  at(100, 'sign_out', { items: signOutItems });
  at(102, 'patient_out', {});
  return list;
}

/** (c) Colonic EMR of a 25 mm lateral spreading lesion, piecemeal, with a deep mural injury (Sydney type III) closed with clips. */
function emr(ctx: TimelineContext): NewEvent[] {
  const { at, list } = recorder(ctx.caseIds.emr, ctx.startAt.emr, ctx);
  const { clip, needle } = ctx.items;
  at(0, 'patient_in', {});
  at(2, 'time_out', { items: timeOutItems });
  at(3, 'sedation_start', { type: 'moderate' });
  at(3.5, 'medication', { drug: 'midazolam', dose: 2, unit: 'mg', route: 'iv' });
  at(4, 'medication', { drug: 'fentanyl', dose: 50, unit: 'microgram', route: 'iv' });
  at(6, 'scope_in', {});
  at(14, 'remark', { text: 'Caecum reached; lesion in the ascending colon' }, 'endoscopist');
  at(15, 'esu_setting', { modeLabel: 'pulsed cut 1', effect: 1, watts: 30 });
  at(17, 'device_opened', { itemId: needle, quantity: 1 });
  at(18, 'injection', { agent: 'saline', volumeMl: 8, dye: 'methylene blue' });
  at(21, 'injection', { agent: 'saline', volumeMl: 5, dye: 'methylene blue' });
  at(23, 'dissection', {});
  const ooze = at(27, 'bleed', { severity: 'ooze' });
  at(28, 'haemostasis', { method: 'snare_tip_soft_coagulation', achieved: true, bleedId: ooze });
  at(31, 'injection', { agent: 'saline', volumeMl: 4, dye: 'methylene blue' });
  at(34, 'resection_complete', { enBloc: false, pieces: 3 });
  at(36, 'image', { caption: 'Target sign in the defect' }, 'endoscopist');
  at(37, 'muscle_defect', { dmiType: 3, sizeMm: 8, perforation: false });
  at(38, 'device_opened', { itemId: clip, quantity: 3 });
  at(39, 'closure_start', {});
  const early = at(39.5, 'clip_fired', { itemId: clip, outcome: 'deployed', purpose: 'closure' });
  at(40, 'void', { targetId: early, reason: 'tapped twice for one clip' });
  at(40.5, 'clip_fired', { itemId: clip, outcome: 'deployed', purpose: 'closure' });
  at(41.5, 'clip_fired', { itemId: clip, outcome: 'misfired', purpose: 'closure' });
  at(42.5, 'clip_fired', { itemId: clip, outcome: 'deployed', purpose: 'closure' });
  at(44, 'closure_complete', { method: 'clips', complete: 'full' });
  at(46, 'specimen_retrieved', { method: 'net', pieces: 3, longMm: 26, shortMm: 21 });
  at(47, 'specimen_labelled', { containerId: 'C1' });
  at(49, 'scope_out', {});
  at(50, 'device_wasted', { itemId: needle, quantity: 1, reason: 'single-use needle discarded after use' });
  at(51, 'sign_out', { items: signOutItems });
  at(53, 'patient_out', {});
  return list;
}

export function demoTimelines(ctx: TimelineContext): { eftr: NewEvent[]; esd: NewEvent[]; emr: NewEvent[] } {
  return { eftr: eftr(ctx), esd: esd(ctx), emr: emr(ctx) };
}
