import type { BleedEpisode, CheckRecord, Counts, TimelineEvent, TimelineEventOf } from './types.ts';

/** Sums of millilitres kept to a thousandth, so 0.1 + 0.2 reads 0.3. */
export const roundMl = (x: number) => Math.round(x * 1000) / 1000;

/** The case's counts, one event at a time; the bleed figures come from the episodes at `finish`. */
export class Counter {
  private clipsDeployed = 0;
  private clipsMisfired = 0;
  private loopsPlaced = 0;
  private devicesApplied = 0;
  private injections = 0;
  private ml = 0;
  private images = 0;
  private medications = 0;

  add(e: TimelineEvent): void {
    switch (e.kind) {
      case 'clip_fired': if (e.payload.outcome === 'deployed') this.clipsDeployed++; else this.clipsMisfired++; break;
      case 'loop_placed': this.loopsPlaced++; break;
      case 'device_applied': this.devicesApplied++; break;
      case 'injection': this.injections++; this.ml += e.payload.volumeMl ?? 0; break;
      case 'image': this.images++; break;
      case 'medication': this.medications++; break;
      default: break;
    }
  }

  finish(bleeds: BleedEpisode[]): Counts {
    return {
      clipsDeployed: this.clipsDeployed, clipsMisfired: this.clipsMisfired, loopsPlaced: this.loopsPlaced, devicesApplied: this.devicesApplied,
      bleeds: bleeds.length, bleedsOpen: bleeds.filter((b) => b.controlledMs === null).length,
      haemostasisAttempts: bleeds.reduce((n, b) => n + b.attempts, 0), injections: this.injections, injectionMl: roundMl(this.ml),
      images: this.images, medications: this.medications,
    };
  }
}

/** En bloc and pieces from the resection-complete tap (the first one, as the resection phase uses). */
export function resectionOutcome(timeline: TimelineEvent[]): { enBloc: boolean | null; pieces: number | null } {
  const done = timeline.find((e): e is TimelineEventOf<'resection_complete'> => e.kind === 'resection_complete');
  return { enBloc: done?.payload.enBloc ?? null, pieces: done?.payload.pieces ?? null };
}

/**
 * A check (time-out or sign-out): present if one was recorded and not skipped (the first such), else
 * skipped with the reason of the last skip, else missing.
 */
export function checkRecord(timeline: TimelineEvent[], kind: 'time_out' | 'sign_out'): CheckRecord {
  let done: TimelineEventOf<'time_out' | 'sign_out'> | null = null;
  let skipped: TimelineEventOf<'time_out' | 'sign_out'> | null = null;
  for (const e of timeline) {
    if (e.kind !== kind) continue;
    if (e.payload.skipped) skipped = e;
    else if (!done) done = e;
  }
  const e = done ?? skipped;
  if (!e) return { status: 'missing', eventId: null, atMs: null, reason: null, answeredNo: [] };
  return {
    status: done ? 'present' : 'skipped', eventId: e.id, atMs: e.atMs, reason: done ? null : e.payload.skipped?.reason ?? null,
    answeredNo: (e.payload.items ?? []).filter((i) => i.answer === 'no').map((i) => i.key),
  };
}
