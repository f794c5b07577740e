import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { findNearDuplicates, NearDuplicateIndex, nearDuplicateKey, NEAR_DUPLICATE_WINDOW_MS } from '#shared/domain/near-duplicates.ts';
import { at, buildEvent, type NewEvent } from '../factories/events.ts';

const caseId = '0195a1b2-0000-7000-8000-000000000001';
const clip = (device: string, ms: number, offsetMs = 0) =>
  buildEvent('clip_fired', { caseId, device, deviceTime: at(ms), offsetMs, payload: { outcome: 'deployed' } });

describe('near-duplicate taps', () => {
  it('pairs the same kind tapped on two tablets 2 s apart', () => {
    const a = clip('tablet-a', 0);
    const b = clip('tablet-b', 2_000);
    const pairs = findNearDuplicates([a, b]);
    expect(pairs).toHaveLength(1);
    expect(pairs[0]).toMatchObject({ first: a, second: b, gapMs: 2_000, key: nearDuplicateKey(a.id, b.id) });
  });

  it('uses a 5 s window by default, both ends included (common practice: two people tap one thing within seconds)', () => {
    expect(NEAR_DUPLICATE_WINDOW_MS).toBe(5_000);
    expect(findNearDuplicates([clip('tablet-a', 0), clip('tablet-b', 5_000)])).toHaveLength(1);
    expect(findNearDuplicates([clip('tablet-a', 0), clip('tablet-b', 5_001)])).toHaveLength(0);
  });

  it('compares corrected time, not device time', () => {
    // Device times 20 s apart, but tablet b runs 19 s slow (offset +19 000 ms): corrected gap 1 s.
    const pairs = findNearDuplicates([clip('tablet-a', 20_000), clip('tablet-b', 0, 19_000)]);
    expect(pairs.map((p) => p.gapMs)).toEqual([1_000]);
  });

  it('never pairs two taps from the same tablet (a second clip is a second clip)', () => {
    expect(findNearDuplicates([clip('tablet-a', 0), clip('tablet-a', 1_000)])).toEqual([]);
  });

  it('never pairs different kinds', () => {
    const bleed = buildEvent('bleed', { caseId, device: 'tablet-b', deviceTime: at(500) });
    expect(findNearDuplicates([clip('tablet-a', 0), bleed])).toEqual([]);
  });

  it('leaves out a pair once one of them is voided', () => {
    const a = clip('tablet-a', 0);
    const b = clip('tablet-b', 1_000);
    const voidB = buildEvent('void', { caseId, device: 'tablet-b', deviceTime: at(9_000), payload: { targetId: b.id, reason: 'Same clip as tablet A' } });
    expect(findNearDuplicates([a, b, voidB])).toEqual([]);
  });

  it('leaves out a pair a person confirmed as two real events', () => {
    const a = clip('tablet-a', 0);
    const b = clip('tablet-b', 1_000);
    expect(findNearDuplicates([a, b], { resolved: new Set([nearDuplicateKey(b.id, a.id)]) })).toEqual([]);
  });

  it('reports each pair of a run of three, earliest first, and keeps every event', () => {
    const a = clip('tablet-a', 0);
    const b = clip('tablet-b', 1_500);
    const c = clip('tablet-a', 3_000);
    const events = [c, a, b];
    const pairs = findNearDuplicates(events);
    expect(pairs.map((p) => [p.first.id, p.second.id])).toEqual([[a.id, b.id], [b.id, c.id]]);
    expect(events).toHaveLength(3);
  });

  it('never treats corrections as taps', () => {
    const target = clip('tablet-a', 0);
    const v1 = buildEvent('amend', { caseId, device: 'tablet-a', deviceTime: at(100), payload: { targetId: target.id, fields: { purpose: 'closure' } } });
    const v2 = buildEvent('amend', { caseId, device: 'tablet-b', deviceTime: at(200), payload: { targetId: target.id, fields: { purpose: 'closure' } } });
    expect(findNearDuplicates([target, v1, v2])).toEqual([]);
  });
});

describe('near-duplicate taps kept up to date as the log grows', () => {
  const step = fc.record({
    kind: fc.constantFrom('clip', 'bleed', 'void'),
    device: fc.constantFrom('tablet-a', 'tablet-b', 'tablet-c'),
    ms: fc.integer({ min: 0, max: 30_000 }),
    voids: fc.nat(),
  });

  it('gives the same pairs, in the same order, as computing them from scratch after every tap, void or lost event', () => {
    fc.assert(fc.property(fc.array(step, { maxLength: 40 }), fc.array(fc.nat(), { maxLength: 3 }), (steps, losses) => {
      const index = new NearDuplicateIndex();
      let log: NewEvent[] = [];
      for (const [k, s] of steps.entries()) {
        const taps = log.filter((e) => e.kind !== 'void');
        if (s.kind === 'void' && taps.length) {
          log = [...log, buildEvent('void', { caseId, device: s.device, deviceTime: at(s.ms), payload: { targetId: taps[s.voids % taps.length]!.id, reason: 'same clip' } })];
        } else if (s.kind === 'bleed') {
          log = [...log, buildEvent('bleed', { caseId, device: s.device, deviceTime: at(s.ms) })];
        } else {
          log = [...log, clip(s.device, s.ms)];
        }
        // Now and then an event leaves the log (refused by the server).
        if (losses.includes(k) && log.length > 1) log = log.filter((_, i) => i !== k % log.length);
        expect(index.update(log)).toEqual(findNearDuplicates(log));
      }
    }), { numRuns: 200 });
  });

  it('keeps the same array while nothing changed, so the screen need not redraw the pairs', () => {
    const log = [clip('tablet-a', 0), clip('tablet-b', 1_000)];
    const index = new NearDuplicateIndex();
    const first = index.update(log);
    expect(first).toHaveLength(1);
    expect(index.update([...log])).toBe(first);
  });
});
