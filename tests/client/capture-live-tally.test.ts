import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildRecord } from '#shared/domain/record/index.ts';
import type { RecordEventInput } from '#shared/domain/record/types.ts';
import { latestOpenBleed, toLiveCounts } from '@/features/capture/live-counts.ts';
import { nextTally, type LiveTally } from '@/features/capture/live-tally.ts';

// Ids in UUIDv7 form, so that voids, amendments and haemostasis taps can name them.
const idOf = (n: number) => `0190b5a0-0000-7000-8000-${n.toString(16).padStart(12, '0')}`;
const T0 = Date.parse('2025-03-14T09:00:00.000Z');

/**
 * What a tap can be: every kind the board reads, corrections, bleeds, invalid payloads and others.
 * A correction names an earlier event, or now and then one that comes later in the log.
 */
type Draft = { kind: string; payload: (ids: string[]) => unknown };
const pick = (ids: string[], i: number) => (i % 5 === 4 || !ids.length ? idOf(ids.length + 1 + (i % 3)) : ids[i % ids.length]!);
const draft: fc.Arbitrary<Draft> = fc.oneof(
  fc.record({ outcome: fc.constantFrom('deployed', 'misfired', 'bogus'), purpose: fc.constantFrom(undefined, 'haemostasis', 'closure') })
    .map((p) => ({ kind: 'clip_fired', payload: () => (p.purpose ? p : { outcome: p.outcome }) })),
  fc.constant({ kind: 'loop_placed', payload: () => ({}) }),
  fc.constantFrom(undefined, 0.1, 0.2, 0.3, 1.5, 2, 7.25, -1).map((v) => ({ kind: 'injection', payload: () => (v === undefined ? {} : { volumeMl: v }) })),
  fc.constantFrom('ooze', 'spurting').map((severity) => ({ kind: 'bleed', payload: () => ({ severity }) })),
  fc.record({ achieved: fc.boolean(), named: fc.nat(), name: fc.boolean() })
    .map(({ achieved, named, name }) => ({ kind: 'haemostasis', payload: (ids: string[]) => (name && ids.length ? { achieved, bleedId: pick(ids, named) } : { achieved }) })),
  fc.nat().map((n) => ({ kind: 'void', payload: (ids: string[]) => ({ targetId: pick(ids, n), reason: 'undo' }) })),
  fc.record({ n: fc.nat(), v: fc.constantFrom(0.5, 3) })
    .map(({ n, v }) => ({ kind: 'amend', payload: (ids: string[]) => ({ targetId: pick(ids, n), fields: { volumeMl: v } }) })),
  fc.constantFrom('dissection', 'coagulation', 'scope_in', 'scope_out', 'image', 'marking').map((kind) => ({ kind, payload: () => ({}) })),
  fc.constant({ kind: 'not_a_kind', payload: () => ({}) }),
);

/**
 * A step of the log: a new event (mostly later than the last, sometimes earlier or at the same ms), a
 * repeat of an earlier one, or the server's copy of an earlier one taking its place (its seq added).
 */
const stepArb = fc.record({
  draft,
  dt: fc.oneof({ weight: 6, arbitrary: fc.integer({ min: 1, max: 5_000 }) }, { weight: 1, arbitrary: fc.constant(0) }, { weight: 1, arbitrary: fc.integer({ min: -60_000, max: -1 }) }),
  repeat: fc.oneof({ weight: 5, arbitrary: fc.constant(null) }, { weight: 1, arbitrary: fc.nat() }),
  accept: fc.oneof({ weight: 3, arbitrary: fc.constant(null) }, { weight: 1, arbitrary: fc.nat() }),
  seq: fc.boolean(),
  cut: fc.integer({ min: 0, max: 3 }),
});
type Step = typeof stepArb extends fc.Arbitrary<infer S> ? S : never;

/** The logs the tablet would hold one after another (each one what the screen renders). */
function makeLogs(steps: Step[]): RecordEventInput[][] {
  const log: RecordEventInput[] = [];
  const logs: RecordEventInput[][] = [];
  let t = T0;
  let seq = 0;
  steps.forEach((s, i) => {
    if (s.repeat !== null && log.length) {
      // The same id again: a repeat delivery, a stored copy, or a later event that reuses an id (the
      // reducer keeps the earlier one).
      const e = log[s.repeat % log.length]!;
      t += 1;
      log.push(s.seq ? { ...e, seq: ++seq } : s.repeat % 2 ? e : { ...e, atMs: t });
    } else {
      t += s.dt;
      const ids = log.map((e) => e.id);
      log.push({ id: idOf(i + 1), kind: s.draft.kind, atMs: t, seq: s.seq ? ++seq : null, payload: s.draft.payload(ids), author: 'u1', device: 'tablet-a' });
    }
    if (s.accept !== null) {
      // The server accepted one of this tablet's events: its copy, with a seq, replaces it in place.
      const k = s.accept % log.length;
      if (log[k]!.seq === null) log[k] = { ...log[k]!, payload: structuredClone(log[k]!.payload), seq: ++seq };
    }
    if (s.cut === 0) logs.push(log.slice());
  });
  logs.push(log.slice());
  return logs;
}

const figures = (t: LiveTally) => ({ counts: t.counts, open: t.openBleed?.bleedId ?? null });
const fromRecord = (input: readonly RecordEventInput[]) => {
  const record = buildRecord(input);
  return { counts: toLiveCounts(record, 0), open: latestOpenBleed(record)?.bleedId ?? null };
};

describe('the board tally', () => {
  it('gives the figures of buildRecord after every batch of taps and acceptances, whichever way it got there', () => {
    fc.assert(fc.property(fc.array(stepArb, { minLength: 1, maxLength: 60 }), (steps) => {
      let tally: LiveTally | null = null;
      for (const input of makeLogs(steps)) {
        tally = nextTally(tally, input);
        expect(figures(tally)).toEqual(fromRecord(input));
      }
    }), { numRuns: 400 });
  });

  it('does not rebuild the record for a clip, a loop or an injection tapped after the rest', () => {
    const base: RecordEventInput[] = Array.from({ length: 200 }, (_, i) => ({ id: idOf(i + 1), kind: i % 2 ? 'injection' : 'dissection', atMs: T0 + i * 1000, seq: i + 1, payload: i % 2 ? { volumeMl: 0.1 } : {} }));
    let builds = 0;
    const build = (input: readonly RecordEventInput[]) => () => { builds++; return buildRecord(input); };
    let tally = nextTally(null, base, build(base));
    let input: RecordEventInput[] = base;
    const taps = [['clip_fired', { outcome: 'deployed' }], ['loop_placed', {}], ['injection', { volumeMl: 0.2 }], ['clip_fired', { outcome: 'misfired' }]] as const;
    taps.forEach(([kind, payload], i) => {
      input = [...input, { id: idOf(1000 + i), kind, atMs: T0 + 500_000 + i, seq: null, payload }];
      tally = nextTally(tally, input, build(input));
    });
    expect(builds).toBe(1);
    expect(tally.counts).toEqual(toLiveCounts(buildRecord(input), 0));
    expect(tally.counts).toMatchObject({ clipsDeployed: 1, clipsMisfired: 1, loopsPlaced: 1, injectionMl: 10.2 });
  });

  it('rebuilds when an event is corrected, a bleed is tapped, or an event comes out of order', () => {
    const clip = { id: idOf(1), kind: 'clip_fired', atMs: T0, seq: null, payload: { outcome: 'deployed' } };
    let builds = 0;
    const counting = (input: readonly RecordEventInput[]) => () => { builds++; return buildRecord(input); };
    let input: RecordEventInput[] = [clip];
    let tally = nextTally(null, input, counting(input));
    for (const e of [
      { id: idOf(2), kind: 'void', atMs: T0 + 1, seq: null, payload: { targetId: clip.id, reason: 'undo' } },
      { id: idOf(3), kind: 'bleed', atMs: T0 + 2, seq: null, payload: {} },
      { id: idOf(4), kind: 'loop_placed', atMs: T0 - 5, seq: null, payload: {} },
    ]) {
      input = [...input, e];
      tally = nextTally(tally, input, counting(input));
    }
    expect(builds).toBe(4);
    expect(tally.counts).toMatchObject({ clipsDeployed: 0, loopsPlaced: 1, bleedsOpen: 1 });
    expect(tally.openBleed?.bleedId).toBe(idOf(3));
  });

  it('keeps the tally when the copy the server stored takes the place of a tap, and rebuilds when the copy could reorder the log', () => {
    let builds = 0;
    const counting = (input: readonly RecordEventInput[]) => () => { builds++; return buildRecord(input); };
    const clip = { id: idOf(1), kind: 'clip_fired', atMs: T0, seq: null, payload: { outcome: 'deployed' } };
    let input: RecordEventInput[] = [clip];
    let tally = nextTally(null, input, counting(input));
    // Accepted (a new object with a seq), then another tap: no rebuild.
    input = [{ ...clip, payload: { outcome: 'deployed' }, seq: 1 }, { id: idOf(2), kind: 'loop_placed', atMs: T0 + 1_000, seq: null, payload: {} }];
    tally = nextTally(tally, input, counting(input));
    expect(builds).toBe(1);
    expect(tally.counts).toEqual(toLiveCounts(buildRecord(input), 0));

    // Two bleeds at the same millisecond, both waiting: the haemostasis controls the later one (by id).
    // When the server takes the later one first, its seq puts it first, and the other one is controlled.
    const a = { id: idOf(3), kind: 'bleed', atMs: T0 + 2_000, seq: null, payload: {} };
    const c = { id: idOf(4), kind: 'bleed', atMs: T0 + 2_000, seq: null, payload: {} };
    const h = { id: idOf(5), kind: 'haemostasis', atMs: T0 + 3_000, seq: null, payload: { achieved: true } };
    input = [...input, a, c, h];
    tally = nextTally(tally, input, counting(input));
    expect(tally.openBleed?.bleedId).toBe(a.id);
    input = input.map((e) => (e === c ? { ...c, seq: 2 } : e));
    tally = nextTally(tally, input, counting(input));
    expect(tally.openBleed?.bleedId).toBe(c.id);
    expect(figures(tally)).toEqual(fromRecord(input));

    // A copy that differs in more than its seq is another event to the reducer: rebuilt.
    const before = builds;
    input = input.map((e) => (e.id === clip.id ? { ...e, payload: { outcome: 'misfired' } } : e));
    tally = nextTally(tally, input, counting(input));
    expect(builds).toBe(before + 1);
    expect(tally.counts).toMatchObject({ clipsDeployed: 0, clipsMisfired: 1 });
  });

  it('rebuilds when an id delivered twice gets its server copy, which can change the delivery the record keeps', () => {
    // Two deliveries of one id, neither stored: the reducer keeps the earlier. Once the server stores the
    // later one (it adds a seq), the stored copy wins, and the figures are the other delivery's.
    const deployed: RecordEventInput = { id: idOf(1), kind: 'clip_fired', atMs: T0, seq: null, payload: { outcome: 'deployed' }, author: 'u1', device: 'tablet-a' };
    const misfired: RecordEventInput = { ...deployed, atMs: T0 + 1_000, payload: { outcome: 'misfired' } };
    let input: RecordEventInput[] = [deployed, misfired];
    let tally = nextTally(null, input);
    expect(tally.counts).toMatchObject({ clipsDeployed: 1, clipsMisfired: 0 });
    input = [deployed, { ...misfired, payload: { outcome: 'misfired' }, seq: 1 }];
    tally = nextTally(tally, input);
    expect(tally.counts).toMatchObject({ clipsDeployed: 0, clipsMisfired: 1 });
    expect(figures(tally)).toEqual(fromRecord(input));

    // The same for a bleed delivered before and after its haemostasis.
    const bleed: RecordEventInput = { id: idOf(2), kind: 'bleed', atMs: T0, seq: null, payload: {}, author: 'u1', device: 'tablet-a' };
    const h: RecordEventInput = { id: idOf(3), kind: 'haemostasis', atMs: T0 + 1_000, seq: null, payload: { achieved: true }, author: 'u1', device: 'tablet-a' };
    const again: RecordEventInput = { ...bleed, atMs: T0 + 2_000 };
    input = [bleed, h, again];
    tally = nextTally(null, input);
    expect(tally.counts).toMatchObject({ bleedsOpen: 0, bleedsControlled: 1 });
    input = [bleed, h, { ...again, seq: 1 }];
    tally = nextTally(tally, input);
    expect(tally.counts).toMatchObject({ bleedsOpen: 1, bleedsControlled: 0 });
    expect(figures(tally)).toEqual(fromRecord(input));
  });

  it('does not count an event appended again (the same object) as a new tap', () => {
    const loop: RecordEventInput = { id: idOf(1), kind: 'loop_placed', atMs: T0, seq: 1, payload: {}, author: 'u1', device: 'tablet-a' };
    const laterCopy: RecordEventInput = { ...loop, atMs: T0 + 1 };
    let tally = nextTally(null, [loop]);
    tally = nextTally(tally, [loop, laterCopy]);
    const input = [loop, laterCopy, laterCopy];
    tally = nextTally(tally, input);
    expect(tally.counts.loopsPlaced).toBe(1);
    expect(figures(tally)).toEqual(fromRecord(input));
  });
});
