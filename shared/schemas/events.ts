import { z } from 'zod';
import { isoDateTimeSchema, uuidSchema, uuidV7Schema } from './common.ts';
import { sedationTypeSchema } from './cases.ts';

/**
 * The event vocabulary (PRODUCT.md, Event vocabulary). Wire names are the trade's; payload fields are
 * camelCase and optional unless marked. Payloads are strict: an unknown field is refused with its name,
 * so nothing a tablet sends is silently dropped.
 */
const obj = <T extends z.ZodRawShape>(shape: T) => z.strictObject(shape);
const empty = obj({});
const itemId = z.string().min(1).max(64);
const text = (max: number) => z.string().trim().min(1).max(max);
const mm = z.number().positive().max(1000);
const count = z.number().int().min(1).max(1000);

const checkItem = obj({ key: text(64), label: text(200).optional(), answer: z.enum(['yes', 'no', 'not_applicable']), note: text(500).optional() });
const checkPayload = obj({ items: z.array(checkItem).max(50).optional(), skipped: obj({ reason: text(500) }).optional() });

export const haemostasisMethods = ['coagulation_forceps', 'clip', 'snare_tip_soft_coagulation', 'argon_plasma_coagulation', 'topical_agent', 'other'] as const;
export const retrievalMethods = ['net', 'basket', 'snare', 'cap_suction'] as const;

export const payloadSchemas = {
  // milestones
  patient_in: empty,
  sedation_start: obj({ type: sedationTypeSchema.optional() }),
  scope_in: empty,
  scope_out: empty,
  patient_out: empty,
  // checks
  time_out: checkPayload,
  sign_out: checkPayload,
  // resection
  marking: empty,
  injection: obj({ agent: text(100).optional(), volumeMl: z.number().positive().max(500).optional(), dye: text(100).optional() }),
  incision: empty,
  dissection: empty,
  resection_complete: obj({ enBloc: z.boolean().optional(), pieces: count.optional() }),
  // injury
  muscle_defect: obj({ dmiType: z.number().int().min(0).max(5).optional(), sizeMm: mm.optional(), perforation: z.boolean().optional() }),
  decompression: obj({ site: text(100).optional() }),
  // bleeding
  bleed: obj({ severity: z.enum(['ooze', 'spurting']).optional(), vesselMm: mm.optional() }),
  haemostasis: obj({ method: z.enum(haemostasisMethods).optional(), achieved: z.boolean(), bleedId: uuidSchema.optional() }),
  coagulation: obj({ target: text(100).optional() }),
  // devices
  clip_fired: obj({ itemId: itemId.optional(), outcome: z.enum(['deployed', 'misfired']), purpose: z.enum(['haemostasis', 'closure', 'anchor']).optional(), usageId: uuidSchema.optional() }),
  loop_placed: obj({ itemId: itemId.optional(), sizeMm: mm.optional(), usageId: uuidSchema.optional() }),
  device_applied: obj({ itemId: itemId.optional(), usageId: uuidSchema.optional() }),
  device_opened: obj({ itemId: itemId.optional(), quantity: count.optional(), reason: text(200).optional(), usageId: uuidSchema.optional() }),
  device_wasted: obj({ itemId: itemId.optional(), quantity: count.optional(), reason: text(200).optional(), usageId: uuidSchema.optional() }),
  // closure
  closure_start: empty,
  closure_complete: obj({ method: text(100).optional(), complete: z.enum(['full', 'partial']).optional() }),
  // specimen
  specimen_retrieved: obj({ method: z.enum(retrievalMethods).optional(), pieces: count.optional(), longMm: mm.optional(), shortMm: mm.optional(), specimenId: uuidSchema.optional() }),
  specimen_labelled: obj({ containerId: text(64).optional(), specimenId: uuidSchema.optional() }),
  // other
  image: obj({ attachmentId: uuidSchema.optional(), caption: text(500).optional() }),
  medication: obj({ drug: text(100).optional(), dose: z.number().positive().max(100000).optional(), unit: text(20).optional(), route: text(40).optional() }),
  esu_setting: obj({ modeLabel: text(60).optional(), effect: z.number().min(0).max(20).optional(), watts: z.number().min(0).max(400).optional() }),
  remark: obj({ text: text(2000) }),
  // corrections
  void: obj({ targetId: uuidSchema, reason: text(500) }),
  amend: obj({ targetId: uuidSchema, fields: z.record(z.string().max(64), z.unknown()) }),
} as const;

export type EventKind = keyof typeof payloadSchemas;
export const eventKinds = Object.keys(payloadSchemas) as EventKind[];
export const eventKindSchema = z.enum(eventKinds as [EventKind, ...EventKind[]]);
export type PayloadOf<K extends EventKind> = z.infer<(typeof payloadSchemas)[K]>;

export const eventGroups = {
  milestones: ['patient_in', 'sedation_start', 'scope_in', 'scope_out', 'patient_out'],
  checks: ['time_out', 'sign_out'],
  resection: ['marking', 'injection', 'incision', 'dissection', 'resection_complete'],
  injury: ['muscle_defect', 'decompression'],
  bleeding: ['bleed', 'haemostasis', 'coagulation'],
  devices: ['clip_fired', 'loop_placed', 'device_applied', 'device_opened', 'device_wasted'],
  closure: ['closure_start', 'closure_complete'],
  specimen: ['specimen_retrieved', 'specimen_labelled'],
  other: ['image', 'medication', 'esu_setting', 'remark'],
  corrections: ['void', 'amend'],
} as const satisfies Record<string, readonly EventKind[]>;

/** The fields every event carries, as the tablet makes it. */
const envelope = {
  /** UUIDv7 made on the tablet at the tap; the idempotency key. */
  id: uuidV7Schema,
  caseId: uuidSchema,
  /** The tablet's clock at the tap. */
  deviceTime: isoDateTimeSchema,
  /** Server clock minus device clock, ms (RFC 5905 θ); corrected time = deviceTime + offsetMs. */
  offsetMs: z.number().finite().min(-86_400_000 * 366).max(86_400_000 * 366),
  /** Half the round-trip delay of the sample the offset came from, ms (RFC 5905: the error bound); null if never synced. */
  offsetUncertaintyMs: z.number().finite().min(0).max(86_400_000).nullable(),
  /** The signed-in user who tapped (user id). */
  author: z.string().min(1).max(64),
  /** A stable id of the tablet (made once, kept in IndexedDB). */
  device: z.string().min(1).max(64),
};

const eventVariants = eventKinds.map((kind) =>
  z.strictObject({ ...envelope, kind: z.literal(kind), payload: payloadSchemas[kind] }),
);

/**
 * An event's envelope with any object as its payload: what an event kept on a tablet must still be for a
 * person to see it and decide, once a later version's payload rules no longer take it as it stands.
 */
export const eventEnvelopeSchema = z.object({ ...envelope, kind: eventKindSchema, payload: z.record(z.string(), z.unknown()) });

/** An event as sent by a tablet (before the server accepts it). */
export const newEventSchema = z.discriminatedUnion('kind', eventVariants as unknown as [ (typeof eventVariants)[number], ...(typeof eventVariants)[number][] ]);

type EnvelopeOf<K extends EventKind> = {
  id: string; caseId: string; deviceTime: string; offsetMs: number; offsetUncertaintyMs: number | null;
  author: string; device: string; kind: K; payload: PayloadOf<K>;
};
export type NewEvent = { [K in EventKind]: EnvelopeOf<K> }[EventKind];
export type NewEventOf<K extends EventKind> = EnvelopeOf<K>;

/** An event the server has accepted: with its per-case sequence number and the time it was stored. */
export type StoredEvent = NewEvent & { seq: number; receivedAt: string };
export const storedEventSchema = z.intersection(newEventSchema, z.object({ seq: z.number().int().positive(), receivedAt: isoDateTimeSchema }));

/** Largest JSON size of one event accepted, bytes (a remark of 2,000 characters fits well). */
export const MAX_EVENT_BYTES = 16 * 1024;

/** Corrected time of an event in ms since the epoch (deviceTime + offsetMs). */
export function correctedTimeMs(e: Pick<NewEvent, 'deviceTime' | 'offsetMs'>): number {
  return Date.parse(e.deviceTime) + e.offsetMs;
}

/** Plain-words labels for the screens (our own wording). */
export const eventLabels: Record<EventKind, string> = {
  patient_in: 'Patient in room', sedation_start: 'Sedation started', scope_in: 'Scope in', scope_out: 'Scope out', patient_out: 'Patient out of room',
  time_out: 'Time-out', sign_out: 'Sign-out',
  marking: 'Marking', injection: 'Injection', incision: 'Incision', dissection: 'Dissection', resection_complete: 'Resection complete',
  muscle_defect: 'Muscle defect', decompression: 'Decompression',
  bleed: 'Bleed', haemostasis: 'Haemostasis', coagulation: 'Coagulation',
  clip_fired: 'Clip fired', loop_placed: 'Loop placed', device_applied: 'Device applied', device_opened: 'Device opened', device_wasted: 'Device wasted',
  closure_start: 'Closure started', closure_complete: 'Closure complete',
  specimen_retrieved: 'Specimen retrieved', specimen_labelled: 'Specimen labelled',
  image: 'Image', medication: 'Medication', esu_setting: 'ESU setting', remark: 'Remark',
  void: 'Voided', amend: 'Amended',
};
