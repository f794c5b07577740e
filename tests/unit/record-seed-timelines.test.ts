import { describe, expect, it } from 'vitest';
import { v4 as uuidv4 } from 'uuid';
import { demoTimelines } from '#server/db/seed/timelines.ts';
import { buildRecord, toRecordInput } from '#shared/domain/record/index.ts';
import { correctedTimeMs, newEventSchema } from '#shared/schemas/events.ts';

// The demo timelines are invented (PRODUCT.md, Demo scenario). Expected figures are read off the minutes
// written in server/db/seed/timelines.ts, worked by hand.

function demoContext() {
  return {
    caseIds: { eftr: uuidv4(), esd: uuidv4(), emr: uuidv4() },
    startAt: { eftr: new Date('2025-03-04T08:30:00Z'), esd: new Date('2025-03-11T09:00:00Z'), emr: new Date('2025-03-18T13:15:00Z') },
    nurseId: 'user-nurse-sofia', endoscopistId: 'user-dr-osei', deviceId: 'demo-tablet-room-a',
    items: { clip: 'item-clip', loop: 'item-loop', otsc: 'item-otsc', needle: 'item-needle' },
  };
}

const ctx = demoContext();
const timelines = demoTimelines(ctx);
const recordOf = (name: keyof typeof timelines) => buildRecord(timelines[name].map(toRecordInput));
const phaseMinutes = (name: keyof typeof timelines) => Object.fromEntries(recordOf(name).phases.map((p) => [p.name, p.minutes]));

describe.each(['eftr', 'esd', 'emr'] as const)('the %s demo timeline', (name) => {
  it('is a list of events each valid against the event schema, for its own case', () => {
    for (const e of timelines[name]) {
      expect(newEventSchema.safeParse(e).success, `${e.kind} ${JSON.stringify(e.payload)}`).toBe(true);
      expect(e).toMatchObject({ caseId: ctx.caseIds[name], offsetMs: 0, device: ctx.deviceId });
    }
    expect(new Set(timelines[name].map((e) => e.id)).size).toBe(timelines[name].length);
  });

  it('is in tap order, with a time-out, sedation, scope in and out, injections, a misfire, a specimen and a sign-out', () => {
    const list = timelines[name];
    const times = list.map(correctedTimeMs);
    expect([...times].sort((a, b) => a - b)).toEqual(times);
    const kinds = new Set(list.map((e) => e.kind));
    for (const k of ['time_out', 'sedation_start', 'scope_in', 'scope_out', 'injection', 'device_opened', 'clip_fired', 'specimen_retrieved', 'sign_out'] as const) expect(kinds).toContain(k);
    expect(list.some((e) => e.kind === 'clip_fired' && e.payload.outcome === 'misfired')).toBe(true);
    expect(list.every((e) => e.kind !== 'injection' || (e.payload.volumeMl ?? 0) > 0)).toBe(true);
  });

  it('builds a record with no problems, every bleed controlled and every device reconciled', () => {
    const r = recordOf(name);
    expect(r.problems).toEqual([]);
    expect(r.flags).toEqual([]);
    expect(r.bleeds.every((b) => b.controlledMs !== null && !b.openAtScopeOut)).toBe(true);
    expect(r.devices.every((d) => d.unaccounted === 0)).toBe(true);
    expect(r.timeOut.status).toBe('present');
    expect(r.signOut.status).toBe('present');
    expect(r.specimen.areaMm2).toBeGreaterThan(0);
  });
});

describe('the demo figures', () => {
  it('give the full-thickness resection its two bleeds, its closure devices and the defect note', () => {
    const r = recordOf('eftr');
    expect(r.counts).toMatchObject({ bleeds: 2, bleedsOpen: 0, clipsDeployed: 4, clipsMisfired: 1, loopsPlaced: 1, devicesApplied: 1, injectionMl: 10 });
    expect(r.bleeds.map((b) => b.secondsToHaemostasis)).toEqual([120, 150]);
    expect(phaseMinutes('eftr')).toEqual({ total: 82, resection: 52, closure: 14, retrieval: 4 });
    expect(r.notes.map((n) => n.kind)).toContain('defect_perimeter');
    expect(r.voided).toHaveLength(1);
  });

  it('give the ESD its en bloc resection and the amended injection volume', () => {
    const r = recordOf('esd');
    expect(r.resection).toEqual({ enBloc: true, pieces: 1 });
    expect(r.counts.injectionMl).toBe(21); // 12 (amended from 10) + 5 + 4
    expect(r.amendmentsApplied).toBe(1);
    expect(phaseMinutes('esd')).toMatchObject({ total: 90, resection: 68 });
    // π/4 · 38 · 31 = 294.5π ≈ 925.2 mm² over 68 minutes.
    expect(r.specimen.areaMm2).toBeCloseTo(294.5 * Math.PI, 6);
  });

  it('give the EMR its deep mural injury closed with clips, a voided double tap not counted', () => {
    const r = recordOf('emr');
    const injury = r.timeline.find((e) => e.kind === 'muscle_defect');
    expect(injury?.payload).toMatchObject({ dmiType: 3, perforation: false });
    expect(r.counts).toMatchObject({ clipsDeployed: 2, clipsMisfired: 1, bleeds: 1 });
    expect(r.resection).toEqual({ enBloc: false, pieces: 3 });
    expect(r.phases.find((p) => p.name === 'closure')?.minutes).toBe(5);
  });
});
