import { z } from 'zod';
import { isoDateSchema, isoDateTimeSchema, uuidSchema } from './common.ts';
import { caseStatusSchema, parisTypeSchema, procedureTypeSchema, sedationTypeSchema, sexSchema } from './cases.ts';
import { catalogueItemTypeSchema } from './catalogue.ts';
import { identifierSchemeSchema } from './device-usages.ts';
import { haemostasisMethods } from './events.ts';
import { handoffStatusSchema, retrievalMethodSchema } from './specimens.ts';

/**
 * GET /api/cases/:id/record — the case's record as the server builds it with `buildRecord` from the
 * stored events, joined with the case, the device usages, the specimen list and the names of the people
 * who recorded. The record page and the PDF both draw this one answer, so they show the same figures.
 * Every time is ISO 8601 (UTC); `timeZone` is the unit's, for showing clock times.
 */
const person = z.object({ id: z.string(), name: z.string() });
const iso = isoDateTimeSchema;

export const recordCheckSchema = z.object({
  status: z.enum(['present', 'skipped', 'missing']),
  at: iso.nullable(),
  by: person.nullable(),
  reason: z.string().nullable(),
  items: z.array(z.object({ key: z.string(), label: z.string(), answer: z.enum(['yes', 'no', 'not_applicable']), note: z.string().nullable() })),
});

export const sectionKeys = ['before_scope', 'resection', 'closure', 'retrieval', 'scope_in', 'after_scope'] as const;
export const sectionKeySchema = z.enum(sectionKeys);
export type SectionKey = z.infer<typeof sectionKeySchema>;

export const timelineEntrySchema = z.object({
  id: z.string(),
  at: iso,
  seq: z.number().int().nullable(),
  kind: z.string(),
  /** Plain words: "Clip deployed", "Bleed". */
  label: z.string(),
  /** The payload in plain words ("spurting, vessel 2 mm"); empty when there is nothing to add. */
  detail: z.string(),
  author: person.nullable(),
  device: z.string().nullable(),
  /** Details added afterwards (amendments applied). */
  amended: z.boolean(),
});
export type TimelineEntry = z.infer<typeof timelineEntrySchema>;

/** A run of consecutive entries inside one phase (or before, between or after the phases). */
export const timelineSectionSchema = z.object({ key: sectionKeySchema, title: z.string(), entries: z.array(timelineEntrySchema) });

export const recordViewSchema = z.object({
  generatedAt: iso,
  timeZone: z.string(),
  case: z.object({
    id: uuidSchema, status: caseStatusSchema, procedureType: procedureTypeSchema, procedureLabel: z.string(),
    scheduledAt: iso, closedAt: iso.nullable(), room: z.string(), indication: z.string(),
    lesion: z.object({ site: z.string(), sizeMm: z.number(), paris: parisTypeSchema }), sedation: sedationTypeSchema, sedationLabel: z.string(),
  }),
  patient: z.object({ hospitalNumber: z.string(), familyName: z.string(), givenName: z.string(), birthDate: isoDateSchema, sex: sexSchema }),
  team: z.object({ endoscopist: person, nurse: person }),
  checks: z.object({ timeOut: recordCheckSchema, signOut: recordCheckSchema }),
  phases: z.array(z.object({ name: z.enum(['total', 'resection', 'closure', 'retrieval']), title: z.string(), start: iso, end: iso.nullable(), minutes: z.number().nullable() })),
  totalMinutes: z.number().nullable(),
  idleGaps: z.array(z.object({ start: iso, end: iso, minutes: z.number() })),
  sections: z.array(timelineSectionSchema),
  voided: z.array(z.object({ id: z.string(), label: z.string(), at: iso })),
  bleeds: z.array(z.object({
    bleedId: z.string(), start: iso, severity: z.enum(['ooze', 'spurting']).nullable(), vesselMm: z.number().nullable(),
    controlledAt: iso.nullable(), secondsToHaemostasis: z.number().nullable(), attempts: z.number().int(), clips: z.number().int(),
    coagulations: z.number().int(), methods: z.array(z.enum(haemostasisMethods)), openAtScopeOut: z.boolean(),
  })),
  counts: z.object({
    clipsDeployed: z.number().int(), clipsMisfired: z.number().int(), loopsPlaced: z.number().int(), devicesApplied: z.number().int(),
    bleeds: z.number().int(), bleedsOpen: z.number().int(), haemostasisAttempts: z.number().int(), injections: z.number().int(),
    injectionMl: z.number(), images: z.number().int(), medications: z.number().int(),
  }),
  resection: z.object({ enBloc: z.boolean().nullable(), pieces: z.number().int().nullable() }),
  devices: z.array(z.object({
    /** Catalogue item id, or "unspecified" for taps that named no item. */
    itemId: z.string(),
    description: z.string(), type: catalogueItemTypeSchema.nullable(), sizeLabel: z.string().nullable(),
    opened: z.number().int(), deployed: z.number().int(), misfired: z.number().int(), wasted: z.number().int(),
    inPatient: z.number().int(), unaccounted: z.number().int(), flagged: z.boolean(),
    lots: z.array(z.object({ lot: z.string().nullable(), expiry: isoDateSchema.nullable(), count: z.number().int(), expired: z.boolean() })),
  })),
  usages: z.array(z.object({
    id: uuidSchema, itemId: z.string().nullable(), description: z.string(), scheme: identifierSchemeSchema, gtin: z.string().nullable(),
    lot: z.string().nullable(), serial: z.string().nullable(), expiry: isoDateSchema.nullable(), expired: z.boolean(),
    at: iso, eventId: z.string().nullable(), eventLabel: z.string().nullable(),
    /** The tap it belongs to was voided: the device is kept here, out of the device table. */
    eventVoided: z.boolean(),
  })),
  specimens: z.array(z.object({
    /** The listed specimen's id, or null for a retrieval tapped but not (yet) in the specimen list. */
    id: uuidSchema.nullable(),
    /**
     * A retrieval tapped but not listed: the specimen id its tap made, for the list to take it under (so
     * the listed specimen is the tapped one, with its time); null on listed rows and taps that made none.
     */
    tapSpecimenId: uuidSchema.nullable(),
    label: z.string().nullable(), retrievedAt: iso.nullable(),
    retrievalMethod: retrievalMethodSchema.nullable(), pieces: z.number().int().nullable(),
    longMm: z.number().nullable(), shortMm: z.number().nullable(), areaMm2: z.number().nullable(),
    containerId: z.string().nullable(), handoffStatus: handoffStatusSchema.nullable(),
  })),
  specimenSummary: z.object({ count: z.number().int(), areaMm2: z.number().nullable(), resectionSpeedMm2PerMin: z.number().nullable() }),
  authorship: z.array(z.object({ author: person, events: z.number().int(), first: iso, last: iso, devices: z.array(z.string()) })),
  notes: z.array(z.object({ kind: z.string(), text: z.string(), caution: z.string() })),
  flags: z.array(z.object({ code: z.string(), message: z.string() })),
  problems: z.array(z.object({ code: z.string(), eventId: z.string().nullable(), message: z.string() })),
  /** The product's caution, shown with the computed notes and on every page of the PDF. */
  caution: z.string(),
});
export type RecordView = z.infer<typeof recordViewSchema>;

/** The standing caution (PRODUCT.md, Cautions shown in the product), in the record's own words. */
export const RECORD_CAUTION =
  'Ledgerline records what happened; it gives no clinical advice. Counts, times and computed notes must be checked by the team before they are signed. Local policy, law and licensed practice take precedence.';

// ——— How the page and the PDF write the figures (one place, so they read alike) ———

/** "42 min", "1 h 05 min", "—" for none. */
export function formatMinutes(minutes: number | null): string {
  if (minutes === null || !Number.isFinite(minutes)) return '—';
  const whole = Math.round(minutes);
  if (whole < 60) return `${whole} min`;
  return `${Math.floor(whole / 60)} h ${String(whole % 60).padStart(2, '0')} min`;
}

/** "4 min 30 s", "45 s", "—". */
export function formatSeconds(seconds: number | null): string {
  if (seconds === null || !Number.isFinite(seconds)) return '—';
  const s = Math.round(seconds);
  if (s < 60) return `${s} s`;
  return `${Math.floor(s / 60)} min ${String(s % 60).padStart(2, '0')} s`;
}

/** Clock time in the unit's zone, 24-hour: "09:41:07". */
export function formatClock(isoTime: string, timeZone: string): string {
  return new Intl.DateTimeFormat('en-GB', { timeZone, hour: '2-digit', minute: '2-digit', second: '2-digit', hourCycle: 'h23' }).format(new Date(isoTime));
}

/** Date and time in the unit's zone: "14 Mar 2025, 09:41". */
export function formatDateTime(isoTime: string, timeZone: string): string {
  return new Intl.DateTimeFormat('en-GB', { timeZone, day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).format(new Date(isoTime));
}

/** "12.0 × 8.0 mm" or "—". */
export function formatAxes(longMm: number | null, shortMm: number | null): string {
  if (longMm === null && shortMm === null) return '—';
  const f = (x: number | null) => (x === null ? '?' : x.toFixed(1));
  return `${f(longMm)} × ${f(shortMm)} mm`;
}

export const formatArea = (mm2: number | null) => (mm2 === null ? '—' : `${mm2.toFixed(1)} mm²`);

/** Our words for the haemostasis methods (the trade's terms). */
export const haemostasisMethodWords: Record<(typeof haemostasisMethods)[number], string> = {
  coagulation_forceps: 'coagulation forceps', clip: 'clip', snare_tip_soft_coagulation: 'snare-tip soft coagulation',
  argon_plasma_coagulation: 'argon plasma coagulation', topical_agent: 'topical agent', other: 'other method',
};
export const checkStatusWords = { present: 'Done', skipped: 'Skipped', missing: 'Not recorded' } as const;
export const checkAnswerWords = { yes: 'Yes', no: 'No', not_applicable: 'Not applicable' } as const;
export const sexWords = { female: 'Female', male: 'Male', other: 'Other', unknown: 'Unknown' } as const;

/**
 * The reconciliation cell (opened = used + wasted, PRODUCT.md): only meaningful when an opening was
 * recorded; otherwise there is nothing to reconcile against.
 */
export function unaccountedWords(d: { opened: number; unaccounted: number; flagged: boolean }): string {
  if (d.opened === 0) return 'no opening recorded';
  return d.flagged ? `${d.unaccounted} — check` : '0';
}

/** "spurting, vessel 2 mm" */
export function bleedWords(b: { severity: 'ooze' | 'spurting' | null; vesselMm: number | null }): string {
  return [b.severity === 'spurting' ? 'spurting' : b.severity === 'ooze' ? 'oozing' : null, b.vesselMm ? `vessel ${b.vesselMm} mm` : null].filter(Boolean).join(', ') || '—';
}

/** "en bloc", "piecemeal, 3 pieces", "—" */
export function resectionWords(r: { enBloc: boolean | null; pieces: number | null }): string {
  if (r.enBloc === null) return '—';
  return r.enBloc ? 'en bloc' : `piecemeal${r.pieces ? `, ${r.pieces} pieces` : ''}`;
}

/** "A12345 (2027-12-31, EXPIRED) × 2" */
export function lotWords(l: { lot: string | null; expiry: string | null; count: number; expired: boolean }): string {
  return `${l.lot ?? '—'} (${l.expiry ?? 'no expiry'}${l.expired ? ', EXPIRED' : ''})${l.count > 1 ? ` × ${l.count}` : ''}`;
}
