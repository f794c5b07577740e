import { correctedTimeMs, type NewEvent, type StoredEvent } from '../../schemas/events.ts';
import { bleedEpisodes } from './bleeds.ts';
import { checkRecord, counts, resectionOutcome } from './counts.ts';
import { deviceTallies } from './devices.ts';
import { recordFlags } from './flags.ts';
import { computedNotes } from './notes.ts';
import { DEFAULT_IDLE_GAP_MS, idleGaps, phases, scopeIntervals } from './phases.ts';
import { specimens, specimenSummary } from './specimen.ts';
import { effectiveTimeline } from './timeline.ts';
import type { CaseRecord, Problem, RecordEventInput, RecordOptions } from './types.ts';

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
 * A case's record from its event log (PRODUCT.md, The record): pure and deterministic, the same on the
 * tablet and the server. The log may come in any order and with repeats; bad events are reported in
 * `problems`, never thrown. One sort, then linear passes.
 */
export function buildRecord(events: readonly RecordEventInput[] | unknown, options: RecordOptions = {}): CaseRecord {
  const problems: Problem[] = [];
  const idleGapMs = typeof options.idleGapMs === 'number' && options.idleGapMs >= 0 ? options.idleGapMs : DEFAULT_IDLE_GAP_MS;
  try {
    const { timeline, voided, amendmentsApplied } = effectiveTimeline(events, problems);
    const scopes = scopeIntervals(timeline);
    const phaseList = phases(timeline, scopes);
    const bleeds = bleedEpisodes(timeline, scopes, problems);
    const devices = deviceTallies(timeline);
    const timeOut = checkRecord(timeline, 'time_out');
    const specimenList = specimens(timeline);
    const specimen = specimenSummary(specimenList, phaseList);
    return {
      timeline, voided, amendmentsApplied, scopeIntervals: scopes, phases: phaseList,
      totalMinutes: phaseList.find((p) => p.name === 'total')?.minutes ?? null,
      idleGaps: idleGaps(timeline, idleGapMs), bleeds, devices, counts: counts(timeline, bleeds),
      resection: resectionOutcome(timeline), timeOut, signOut: checkRecord(timeline, 'sign_out'),
      specimens: specimenList, specimen, notes: computedNotes(timeline, specimenList, specimen),
      flags: recordFlags(bleeds, devices, timeOut, scopes), problems: problems.sort(problemOrder),
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
