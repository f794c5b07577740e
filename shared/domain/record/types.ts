import type { EventKind, PayloadOf, haemostasisMethods, retrievalMethods } from '../../schemas/events.ts';

/**
 * One event of a case's log as the reducer reads it: a StoredEvent (or a tablet's not-yet-accepted
 * NewEvent) reduced to what the record needs. `toRecordInput` makes one from either.
 */
export type RecordEventInput = {
  id: string;
  kind: string;
  /** Corrected time, ms since the epoch (deviceTime + offsetMs: `correctedTimeMs`). */
  atMs: number;
  /** The server's per-case sequence number; absent or null while the event is only on the tablet. */
  seq?: number | null;
  payload?: unknown;
  author?: string | null;
  device?: string | null;
};

export type RecordOptions = {
  /** A pause longer than this between consecutive events while the scope is in is an idle gap (ms). Default 10 min. */
  idleGapMs?: number;
};

type TimelineBase = {
  id: string;
  atMs: number;
  seq: number | null;
  author: string | null;
  device: string | null;
  /** Ids of the amendments applied to this event's payload, in the order applied. */
  amendedBy: readonly string[];
};

/** An event of the effective timeline: not voided, amendments applied, payload valid for its kind. */
export type TimelineEvent = { [K in EventKind]: TimelineBase & { kind: K; payload: PayloadOf<K> } }[EventKind];
export type TimelineEventOf<K extends EventKind> = Extract<TimelineEvent, { kind: K }>;

export type PhaseName = 'total' | 'resection' | 'closure' | 'retrieval';

export type Phase = {
  name: PhaseName;
  startMs: number;
  /** Null while the phase is still running (its end not yet tapped). */
  endMs: number | null;
  minutes: number | null;
  startEventId: string;
  endEventId: string | null;
};

export type ScopeInterval = { inMs: number; outMs: number | null; inEventId: string; outEventId: string | null };

export type IdleGap = { startMs: number; endMs: number; minutes: number; afterEventId: string; beforeEventId: string };

export type BleedEpisode = {
  bleedId: string;
  startMs: number;
  severity: 'ooze' | 'spurting' | null;
  vesselMm: number | null;
  /** Time of the haemostasis (achieved) that controlled it; null while open. */
  controlledMs: number | null;
  controlledBy: string | null;
  secondsToHaemostasis: number | null;
  /** Haemostasis events plus deployed haemostasis clips within the episode. */
  attempts: number;
  clips: number;
  coagulations: number;
  methods: (typeof haemostasisMethods)[number][];
  /** Still uncontrolled when the scope came out for the last time. */
  openAtScopeOut: boolean;
};

export type DeviceTally = {
  /** Catalogue item id, or UNSPECIFIED_ITEM for events that named none. */
  itemId: string;
  opened: number;
  deployed: number;
  misfired: number;
  wasted: number;
  inPatient: number;
  /** opened − deployed − misfired − wasted. */
  unaccounted: number;
  /** Something was opened and the count does not reconcile. */
  flagged: boolean;
};

export type Counts = {
  clipsDeployed: number;
  clipsMisfired: number;
  loopsPlaced: number;
  devicesApplied: number;
  bleeds: number;
  bleedsOpen: number;
  haemostasisAttempts: number;
  injections: number;
  injectionMl: number;
  images: number;
  medications: number;
};

export type CheckRecord = {
  status: 'present' | 'skipped' | 'missing';
  eventId: string | null;
  atMs: number | null;
  /** The reason given when the check was skipped. */
  reason: string | null;
  /** Keys of check items answered "no". */
  answeredNo: string[];
};

export type Specimen = {
  eventId: string;
  atMs: number;
  method: (typeof retrievalMethods)[number] | null;
  pieces: number | null;
  longMm: number | null;
  shortMm: number | null;
  areaMm2: number | null;
};

export type SpecimenSummary = {
  count: number;
  /** Sum of the ellipse areas of the specimens measured on both axes; null if none was. */
  areaMm2: number | null;
  /** areaMm2 per minute of the resection phase. */
  resectionSpeedMm2PerMin: number | null;
};

export type ComputedNote = {
  kind: 'specimen_area' | 'resection_speed' | 'defect_perimeter';
  text: string;
  values: Record<string, number>;
  caution: string;
};

export type FlagCode = 'bleed_open_at_scope_out' | 'device_unaccounted' | 'time_out_missing' | 'time_out_skipped' | 'time_out_after_scope_in' | 'sign_out_scope_in';
export type RecordFlag = { code: FlagCode; message: string; ref: string | null };

export type ProblemCode =
  | 'malformed_event' | 'unknown_kind' | 'invalid_payload' | 'duplicate_conflict' | 'unknown_target'
  | 'self_target' | 'void_cycle' | 'not_amendable' | 'invalid_amendment' | 'unknown_bleed' | 'internal_error';
export type Problem = { code: ProblemCode; eventId: string | null; message: string };

export type VoidedEvent = { id: string; kind: string; atMs: number; voidedBy: string[] };

export type CaseRecord = {
  timeline: TimelineEvent[];
  voided: VoidedEvent[];
  amendmentsApplied: number;
  scopeIntervals: ScopeInterval[];
  phases: Phase[];
  /** Minutes of the total phase (scope in → scope out); null until the scope is out. */
  totalMinutes: number | null;
  idleGaps: IdleGap[];
  bleeds: BleedEpisode[];
  devices: DeviceTally[];
  counts: Counts;
  resection: { enBloc: boolean | null; pieces: number | null };
  timeOut: CheckRecord;
  signOut: CheckRecord;
  specimens: Specimen[];
  specimen: SpecimenSummary;
  notes: ComputedNote[];
  flags: RecordFlag[];
  problems: Problem[];
};
