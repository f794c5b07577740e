import { haemostasisMethods, retrievalMethods, type EventKind } from '#shared/schemas/events.ts';
import { sedationTypeLabels, sedationTypes } from '#shared/schemas/cases.ts';

/**
 * The optional details of each kind, as the quick sheet asks for them: big choice chips first, a number
 * with preset chips and a stepper, free text last (an on-screen keyboard with gloves is slow). Field
 * names are the payload's (shared/schemas/events.ts), so the answers are the `amend` fields as they are.
 */
export type DetailField =
  | { name: string; label: string; type: 'choice'; options: { value: string | number; label: string }[] }
  | { name: string; label: string; type: 'number'; unit: string; presets: number[]; min: number; max: number; step: number; integer?: boolean }
  | { name: string; label: string; type: 'text'; presets?: string[]; maxLength: number; required?: boolean; multiline?: boolean }
  | { name: string; label: string; type: 'boolean'; yes: string; no: string }
  | { name: string; label: string; type: 'item' };

const choice = (name: string, label: string, options: readonly string[], labels: Record<string, string>): DetailField =>
  ({ name, label, type: 'choice', options: options.map((value) => ({ value, label: labels[value] ?? value })) });
const num = (name: string, label: string, unit: string, presets: number[], o: { min?: number; max: number; step?: number; integer?: boolean }): DetailField =>
  ({ name, label, type: 'number', unit, presets, min: o.min ?? 0, max: o.max, step: o.step ?? 1, integer: o.integer });
const text = (name: string, label: string, maxLength: number, presets?: string[]): DetailField => ({ name, label, type: 'text', maxLength, presets });
const item: DetailField = { name: 'itemId', label: 'Catalogue item (scan or type)', type: 'item' };
const quantity = num('quantity', 'How many', '', [1, 2, 3, 4], { min: 1, max: 1000, integer: true });

export const haemostasisMethodLabels: Record<(typeof haemostasisMethods)[number], string> = {
  coagulation_forceps: 'Coagulation forceps', clip: 'Clip', snare_tip_soft_coagulation: 'Snare-tip soft coagulation',
  argon_plasma_coagulation: 'Argon plasma coagulation', topical_agent: 'Topical agent', other: 'Other',
};
export const retrievalMethodLabels: Record<(typeof retrievalMethods)[number], string> = {
  net: 'Net', basket: 'Basket', snare: 'Snare', cap_suction: 'Cap suction',
};

/** Preset chips are shortcuts only; any value in range can be typed. Preset values: common practice. */
export const detailFields: Partial<Record<EventKind, DetailField[]>> = {
  sedation_start: [choice('type', 'Sedation', sedationTypes, sedationTypeLabels)],
  injection: [
    num('volumeMl', 'Volume', 'ml', [1, 2, 5, 10], { max: 500, step: 0.5 }),
    text('agent', 'Agent', 100, ['Saline', 'Gelatin solution', 'Hyaluronate']),
    text('dye', 'Dye', 100, ['Indigo carmine', 'Methylene blue']),
  ],
  resection_complete: [
    { name: 'enBloc', label: 'Removed', type: 'boolean', yes: 'En bloc', no: 'Piecemeal' },
    num('pieces', 'Pieces', '', [1, 2, 3, 4, 5], { min: 1, max: 1000, integer: true }),
  ],
  muscle_defect: [
    // Sydney deep mural injury classification, types 0–V (Burgess et al., Gastroenterology 2017).
    { name: 'dmiType', label: 'Sydney type', type: 'choice', options: [0, 1, 2, 3, 4, 5].map((v) => ({ value: v, label: ['0', 'I', 'II', 'III', 'IV', 'V'][v]! })) },
    num('sizeMm', 'Size', 'mm', [2, 5, 10], { max: 1000 }),
    { name: 'perforation', label: 'Perforation', type: 'boolean', yes: 'Yes', no: 'No' },
  ],
  decompression: [text('site', 'Site', 100, ['Abdomen (needle)', 'Chest'])],
  bleed: [
    choice('severity', 'Bleeding', ['ooze', 'spurting'], { ooze: 'Oozing', spurting: 'Spurting' }),
    num('vesselMm', 'Vessel', 'mm', [1, 2, 3], { max: 1000, step: 0.5 }),
  ],
  haemostasis: [choice('method', 'Method', haemostasisMethods, haemostasisMethodLabels)],
  coagulation: [text('target', 'Target', 100, ['Vessel', 'Margin', 'Defect base'])],
  clip_fired: [choice('purpose', 'Purpose', ['haemostasis', 'closure', 'anchor'], { haemostasis: 'Haemostasis', closure: 'Closure', anchor: 'Anchor' }), item],
  loop_placed: [num('sizeMm', 'Loop size', 'mm', [20, 30], { max: 1000 }), item],
  device_applied: [item],
  device_opened: [item, quantity, text('reason', 'Reason', 200)],
  device_wasted: [item, quantity, text('reason', 'Reason', 200, ['Dropped', 'Opened in error', 'Faulty'])],
  closure_complete: [
    choice('complete', 'Closure', ['full', 'partial'], { full: 'Full', partial: 'Partial' }),
    text('method', 'Method', 100, ['Clips', 'Loop and clips', 'Over-the-scope clip', 'Suturing']),
  ],
  specimen_retrieved: [
    choice('method', 'Retrieved with', retrievalMethods, retrievalMethodLabels),
    num('pieces', 'Pieces', '', [1, 2, 3], { min: 1, max: 1000, integer: true }),
    num('longMm', 'Long axis', 'mm', [20, 30, 40], { max: 1000 }),
    num('shortMm', 'Short axis', 'mm', [15, 20, 30], { max: 1000 }),
  ],
  specimen_labelled: [text('containerId', 'Container', 64)],
  image: [text('caption', 'Caption', 500)],
  medication: [
    text('drug', 'Drug', 100),
    num('dose', 'Dose', '', [1, 2, 5, 10], { max: 100000, step: 0.5 }),
    text('unit', 'Unit', 20, ['mg', 'mcg', 'ml', 'units']),
    text('route', 'Route', 40, ['IV', 'IM', 'SC', 'Topical']),
  ],
  esu_setting: [
    text('modeLabel', 'Mode (as on the unit)', 60),
    num('effect', 'Effect', '', [1, 2, 3, 4], { max: 20 }),
    num('watts', 'Power', 'W', [20, 40, 60], { max: 400 }),
  ],
  remark: [{ name: 'text', label: 'Remark', type: 'text', maxLength: 2000, required: true, multiline: true }],
};

/** A field's value shown in a row of the recent list ("10 ml", "Spurting"). */
export function describeValue(field: DetailField, value: unknown): string {
  if (value === undefined || value === null || value === '') return '';
  switch (field.type) {
    case 'choice': return field.options.find((o) => o.value === value)?.label ?? String(value);
    case 'boolean': return value ? field.yes : field.no;
    case 'number': return field.unit ? `${value} ${field.unit}` : `${field.label} ${value}`;
    default: return String(value);
  }
}

/** A short summary of an event's details for its row, in the order of its fields. */
export function summarizeDetails(kind: EventKind, payload: Record<string, unknown>): string {
  return (detailFields[kind] ?? []).map((f) => describeValue(f, payload[f.name])).filter(Boolean).join(' · ');
}
