import { v7 as uuidv7 } from 'uuid';
import type { EventKind, PayloadOf } from '#shared/schemas/events.ts';
import { detailFields, type DetailField } from './details.ts';

/**
 * The tap pad: every button the nurse can press, grouped by what she is doing at the time. A button is
 * one event kind with the fields fixed at the tap (a clip button already knows its outcome, because the
 * schema requires it); everything else is optional and asked for on the quick sheet after the tap.
 * The five most frequent actions of a therapeutic case (clip deployed, bleed, haemostasis achieved,
 * injection, loop placed — common practice) are the large buttons; the order inside a group follows
 * the order things usually happen in a case.
 */
export type TapSize = 'primary' | 'standard';

export interface TapButton<K extends EventKind = EventKind> {
  /** Stable key (test ids, React keys). */
  key: string;
  kind: K;
  /** Our own words on the button. */
  label: string;
  /** A second line in smaller type, when the label alone could be read two ways. */
  hint?: string;
  /** Fields fixed by the button itself (required fields of the schema live here). */
  fixed: Partial<PayloadOf<K>>;
  size: TapSize;
  /** The sheet asks for these after the tap; empty = no sheet. */
  details: DetailField[];
  /** The event cannot exist without a field (a remark needs its text): the sheet comes first. */
  sheetFirst?: boolean;
}

export interface TapGroup { key: string; title: string; buttons: TapButton[] }

const b = <K extends EventKind>(key: string, kind: K, label: string, opts: Partial<Pick<TapButton<K>, 'hint' | 'fixed' | 'size' | 'sheetFirst'>> = {}): TapButton =>
  ({ key, kind, label, fixed: opts.fixed ?? {}, size: opts.size ?? 'standard', details: detailFields[kind] ?? [], hint: opts.hint, sheetFirst: opts.sheetFirst }) as unknown as TapButton;

/** The large buttons, in one row at the top of the pad. */
export const primaryButtons: TapButton[] = [
  b('clip-deployed', 'clip_fired', 'Clip deployed', { fixed: { outcome: 'deployed' }, size: 'primary' }),
  b('bleed', 'bleed', 'Bleed', { size: 'primary' }),
  b('haemostasis', 'haemostasis', 'Haemostasis achieved', { fixed: { achieved: true }, size: 'primary' }),
  b('injection', 'injection', 'Injection', { size: 'primary' }),
  b('loop', 'loop_placed', 'Loop placed', { size: 'primary' }),
];

export const tapGroups: TapGroup[] = [
  { key: 'milestones', title: 'Case milestones', buttons: [
    b('patient-in', 'patient_in', 'Patient in'),
    b('sedation', 'sedation_start', 'Sedation started'),
    b('scope-in', 'scope_in', 'Scope in'),
    b('scope-out', 'scope_out', 'Scope out'),
    b('patient-out', 'patient_out', 'Patient out'),
  ] },
  { key: 'resection', title: 'Resection', buttons: [
    b('marking', 'marking', 'Marking'),
    b('incision', 'incision', 'Incision'),
    b('dissection', 'dissection', 'Dissection'),
    b('resection-complete', 'resection_complete', 'Resection done'),
  ] },
  { key: 'bleeding', title: 'Bleeding and injury', buttons: [
    b('haemostasis-attempt', 'haemostasis', 'Haemostasis attempt', { fixed: { achieved: false } }),
    b('coagulation', 'coagulation', 'Coagulation'),
    b('muscle-defect', 'muscle_defect', 'Muscle defect'),
    b('decompression', 'decompression', 'Decompression'),
  ] },
  { key: 'devices', title: 'Devices', buttons: [
    b('clip-misfired', 'clip_fired', 'Clip misfired', { fixed: { outcome: 'misfired' } }),
    b('device-applied', 'device_applied', 'OTS clip / suture'),
    b('device-opened', 'device_opened', 'Device opened'),
    b('device-wasted', 'device_wasted', 'Device wasted'),
  ] },
  { key: 'closure', title: 'Closure', buttons: [
    b('closure-start', 'closure_start', 'Closure started'),
    b('closure-complete', 'closure_complete', 'Closure done'),
  ] },
  { key: 'specimen', title: 'Specimen', buttons: [
    b('specimen-retrieved', 'specimen_retrieved', 'Specimen out'),
    b('specimen-labelled', 'specimen_labelled', 'Specimen labelled'),
  ] },
  { key: 'other', title: 'Other', buttons: [
    b('medication', 'medication', 'Medication'),
    b('esu', 'esu_setting', 'ESU setting'),
    b('image', 'image', 'Image taken'),
    b('remark', 'remark', 'Remark', { sheetFirst: true }),
  ] },
];

export const allButtons: TapButton[] = [...primaryButtons, ...tapGroups.flatMap((g) => g.buttons)];

/**
 * The payload a tap of `btn` starts with: its fixed fields, and for a specimen out a new specimen id,
 * so that the specimen listed later (its label, container and hand-off) can be the one tapped, and its
 * container label carry the time it came out.
 */
export function tapPayload(btn: TapButton): Record<string, unknown> {
  return btn.kind === 'specimen_retrieved' ? { ...btn.fixed, specimenId: uuidv7() } : { ...btn.fixed };
}

/** The button that made an event, for the label of a row (clip deployed vs misfired). */
export function buttonFor(kind: EventKind, payload: Record<string, unknown>): TapButton | undefined {
  return allButtons.find((btn) => btn.kind === kind && Object.entries(btn.fixed).every(([k, v]) => payload[k] === v))
    ?? allButtons.find((btn) => btn.kind === kind);
}
