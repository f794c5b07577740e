import { correctedTimeMs, type NewEvent, type StoredEvent } from '../../schemas/events.ts';
import { BleedEpisodes } from './bleeds.ts';
import { checkRecord, Counter, resectionOutcome } from './counts.ts';
import { DeviceTallies } from './devices.ts';
import { recordFlags } from './flags.ts';
import { computedNotes } from './notes.ts';
import { DEFAULT_IDLE_GAP_MS, IdleGaps, phases, RESECTION_START_KINDS, scopeIntervals } from './phases.ts';
import { specimens, specimenSummary } from './specimen.ts';
import { effectiveTimeline } from './timeline.ts';
import type { CaseRecord, Problem, RecordEventInput, RecordOptions, TimelineEvent } from './types.ts';

export type * from './types.ts';
export { UNSPECIFIED_ITEM } from './devices.ts';
export { DEFAULT_IDLE_GAP_MS } from './phases.ts';
export { COMPUTED_NOTE_CAUTION } from '../geometry.ts';

/** The reducer's input from a stored or a new event: its corrected time, and its sequence once stored. */
export function toRecordInput(e: NewEvent | StoredEvent): RecordEventInput {
  return {
    id: e.id, kind: e.kind, atMs: correctedTimeMs(e), seq: 'seq' in e ? e.seq : null, payload: e.payload, author: e.author, device: e.device,
  };
}

// Plain code-unit order (not localeCompare), so the tablet and the server list problems alike.
const cmp = (x: string, y: string) => (x < y ? -1 : x > y ? 1 : 0);
const problemOrder = (a: Problem, b: Problem) => cmp(a.eventId ?? '', b.eventId ?? '') || cmp(a.code, b.code) || cmp(a.message, b.message);

/**
 * The kinds each list-reading pass reads. Every pass ignores the other kinds, so it is handed only its own
 * events, routed as each event joins the timeline. The passes that read most of the log (bleeds, devices,
 * counts, idle gaps) take each event as it joins, while it and its payload are in the cache: on long logs
 * every later pass over the events would cost a cache miss per event.
 */
const PASS_KINDS = {
  scopes: ['scope_in', 'scope_out'],
  // The resection's start kinds are a third of a long log, and only the first counts: only it is routed.
  phases: ['marking', 'injection', 'incision', 'dissection', 'resection_complete', 'closure_start', 'clip_fired', 'loop_placed', 'closure_complete', 'specimen_retrieved'],
  resection: ['resection_complete'],
  timeOut: ['time_out'],
  signOut: ['sign_out'],
  specimens: ['specimen_retrieved'],
  notes: ['loop_placed', 'muscle_defect'],
} as const satisfies Record<string, readonly TimelineEvent['kind'][]>;
type Pass = keyof typeof PASS_KINDS;
const RESECTION_START = new Set<string>(RESECTION_START_KINDS);

const ROUTES: Map<string, Pass[]> = (() => {
  const routes = new Map<string, Pass[]>();
  for (const [pass, kinds] of Object.entries(PASS_KINDS) as [Pass, readonly string[]][]) {
    for (const kind of kinds) routes.set(kind, [...(routes.get(kind) ?? []), pass]);
  }
  return routes;
})();

/** The passes fed one event at a time, and the lists of the others, filled as events join the timeline. */
function passes(idleGapMs: number) {
  const by = Object.fromEntries(Object.keys(PASS_KINDS).map((p) => [p, []])) as unknown as Record<Pass, TimelineEvent[]>;
  const bleeds = new BleedEpisodes();
  const devices = new DeviceTallies();
  const counter = new Counter();
  const gaps = new IdleGaps(idleGapMs);
  let resectionStarted = false;
  const add = (e: TimelineEvent) => {
    bleeds.add(e);
    devices.add(e);
    counter.add(e);
    gaps.add(e);
    const lists = ROUTES.get(e.kind);
    if (!lists) return;
    for (const p of lists) {
      if (p === 'phases' && RESECTION_START.has(e.kind)) {
        if (resectionStarted) continue;
        resectionStarted = true;
      }
      by[p].push(e);
    }
  };
  return { by, bleeds, devices, counter, gaps, add };
}

/**
 * A case's record from its event log (PRODUCT.md, The record): pure and deterministic, the same on the
 * tablet and the server. The log may come in any order and with repeats; bad events are reported in
 * `problems`, never thrown. One sort, then linear passes.
 */
export function buildRecord(events: readonly RecordEventInput[] | unknown, options: RecordOptions = {}): CaseRecord {
  const problems: Problem[] = [];
  const idleGapMs = typeof options.idleGapMs === 'number' && options.idleGapMs >= 0 ? options.idleGapMs : DEFAULT_IDLE_GAP_MS;
  try {
    const { by, bleeds: bleedPass, devices: devicePass, counter, gaps, add } = passes(idleGapMs);
    const { timeline, voided, amendmentsApplied } = effectiveTimeline(events, problems, { onEvent: add, onCorrected: (kindOf) => bleedPass.lookAhead(kindOf) });
    const scopes = scopeIntervals(by.scopes);
    const phaseList = phases(by.phases, scopes);
    const bleeds = bleedPass.finish(scopes, problems);
    const devices = devicePass.finish();
    const timeOut = checkRecord(by.timeOut, 'time_out');
    const signOut = checkRecord(by.signOut, 'sign_out');
    const specimenList = specimens(by.specimens);
    const specimen = specimenSummary(specimenList, phaseList);
    return {
      timeline, voided, amendmentsApplied, scopeIntervals: scopes, phases: phaseList,
      totalMinutes: phaseList.find((p) => p.name === 'total')?.minutes ?? null,
      idleGaps: gaps.finish(), bleeds, devices, counts: counter.finish(bleeds),
      resection: resectionOutcome(by.resection), timeOut, signOut,
      specimens: specimenList, specimen, notes: computedNotes(by.notes, specimenList, specimen),
      flags: recordFlags(bleeds, devices, timeOut, scopes, signOut), problems: problems.sort(problemOrder),
    };
  } catch (error) {
    // A safety net: the record must be built whatever the log holds. Reaching it is a bug to report.
    problems.push({ code: 'internal_error', eventId: null, message: `the record could not be built: ${error instanceof Error ? error.message : String(error)}` });
    return emptyRecord(problems);
  }
}

function emptyRecord(problems: Problem[]): CaseRecord {
  const missing = { status: 'missing', eventId: null, atMs: null, reason: null, answeredNo: [] } as const;
  return {
    timeline: [], voided: [], amendmentsApplied: 0, scopeIntervals: [], phases: [], totalMinutes: null, idleGaps: [], bleeds: [], devices: [],
    counts: { clipsDeployed: 0, clipsMisfired: 0, loopsPlaced: 0, devicesApplied: 0, bleeds: 0, bleedsOpen: 0, haemostasisAttempts: 0, injections: 0, injectionMl: 0, images: 0, medications: 0 },
    resection: { enBloc: null, pieces: null }, timeOut: { ...missing, answeredNo: [] }, signOut: { ...missing, answeredNo: [] },
    specimens: [], specimen: { count: 0, areaMm2: null, resectionSpeedMm2PerMin: null }, notes: [], flags: [], problems,
  };
}
