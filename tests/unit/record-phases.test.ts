import { describe, expect, it } from 'vitest';
import { buildRecord, type Phase } from '#shared/domain/record/index.ts';
import { caseLog, scopedCase } from './record-factories.ts';

// Phase definitions are the reducer's own, documented in shared/domain/record/phases.ts after PRODUCT.md
// ("Phases and durations"); durations are worked by hand from the invented minutes below.

const phase = (events: Parameters<typeof buildRecord>[0], name: Phase['name']) => buildRecord(events).phases.find((p) => p.name === name);

describe('the total phase', () => {
  it('runs from the first scope in to the last scope out, across a re-entry', () => {
    const log = scopedCase();
    log.tap(30, 'scope_out', {});
    log.tap(35, 'scope_in', {});
    log.tap(82, 'scope_out', {});
    const record = buildRecord(log.events);
    expect(record.totalMinutes).toBe(82);
    expect(record.scopeIntervals.map((s) => [s.inMs, s.outMs].map((t) => (t! - s.inMs) / 60_000))).toEqual([[0, 30], [0, 47]]);
  });

  it('stays open while the scope is in', () => {
    const log = scopedCase();
    log.tap(5, 'marking', {});
    expect(phase(log.events, 'total')).toMatchObject({ endMs: null, minutes: null });
    expect(buildRecord(log.events).totalMinutes).toBeNull();
  });

  it('ignores a second scope-in tap while the scope is in', () => {
    const log = scopedCase(40);
    log.tap(1, 'scope_in', {});
    log.close();
    expect(buildRecord(log.events).scopeIntervals).toHaveLength(1);
    expect(buildRecord(log.events).totalMinutes).toBe(40);
  });
});

describe('the resection phase', () => {
  it('runs from the first marking, injection or incision to resection complete', () => {
    const log = scopedCase();
    log.tap(4, 'injection', { volumeMl: 5 });
    log.tap(6, 'marking', {});
    log.tap(40, 'resection_complete', { enBloc: true });
    log.close();
    expect(phase(log.events, 'resection')).toMatchObject({ minutes: 36 });
  });

  it('is left out with no start mark, and open without its end', () => {
    const none = scopedCase();
    none.tap(40, 'resection_complete', {});
    expect(phase(none.events, 'resection')).toBeUndefined();
    const open = scopedCase();
    open.tap(3, 'incision', {});
    expect(phase(open.events, 'resection')).toMatchObject({ endMs: null, minutes: null });
  });
});

describe('the closure phase', () => {
  it('starts at closure start when tapped', () => {
    const log = scopedCase();
    log.tap(2, 'marking', {});
    log.tap(30, 'resection_complete', {});
    log.tap(33, 'closure_start', {});
    log.tap(35, 'clip_fired', { outcome: 'deployed', purpose: 'closure' });
    log.tap(45, 'closure_complete', { complete: 'full' });
    expect(phase(log.events, 'closure')).toMatchObject({ minutes: 12 });
  });

  it('starts at the first closure clip or loop after the resection when closure start was not tapped', () => {
    const log = scopedCase();
    log.tap(2, 'marking', {});
    log.tap(10, 'loop_placed', { sizeMm: 20 }); // before the resection ends: not a closure
    log.tap(30, 'resection_complete', {});
    log.tap(31, 'clip_fired', { outcome: 'deployed', purpose: 'haemostasis' });
    log.tap(34, 'clip_fired', { outcome: 'deployed', purpose: 'closure' });
    log.tap(44, 'closure_complete', {});
    expect(phase(log.events, 'closure')).toMatchObject({ minutes: 10 });
  });

  it('starts at a loop placed after the resection', () => {
    const log = scopedCase();
    log.tap(20, 'resection_complete', {});
    log.tap(25, 'loop_placed', { sizeMm: 30 });
    log.tap(28, 'closure_complete', {});
    expect(phase(log.events, 'closure')).toMatchObject({ minutes: 3 });
  });
});

describe('the retrieval phase', () => {
  it('runs from resection complete to the specimen retrieved', () => {
    const log = scopedCase();
    log.tap(2, 'marking', {});
    log.tap(30, 'resection_complete', {});
    log.tap(34, 'specimen_retrieved', { method: 'net' });
    log.close();
    expect(phase(log.events, 'retrieval')).toMatchObject({ minutes: 4 });
  });

  it('runs from the scope’s re-entry when the scope went out and back in before the retrieval', () => {
    const log = scopedCase();
    log.tap(2, 'marking', {});
    log.tap(30, 'resection_complete', {});
    log.tap(31, 'scope_out', {});
    log.tap(38, 'scope_in', {});
    log.tap(41, 'specimen_retrieved', { method: 'basket' });
    log.close();
    expect(phase(log.events, 'retrieval')).toMatchObject({ minutes: 3 });
  });

  it('is left out of a finished case where no retrieval was tapped', () => {
    const log = scopedCase();
    log.tap(2, 'marking', {});
    log.tap(30, 'resection_complete', {});
    log.close();
    expect(phase(log.events, 'retrieval')).toBeUndefined();
  });

  it('runs from the resection complete when every resection mark came after it (an injection for a bleed after a cold snare)', () => {
    const log = scopedCase(); // scope in at 0, out at 60
    log.tap(20, 'resection_complete', { enBloc: true });
    const bleed = log.tap(21, 'bleed', { severity: 'ooze' });
    log.tap(22, 'injection', { agent: 'adrenaline', volumeMl: 2 });
    log.tap(23, 'haemostasis', { method: 'coagulation_forceps', achieved: true, bleedId: bleed });
    log.tap(30, 'specimen_retrieved', { method: 'net', longMm: 20, shortMm: 15 });
    log.close();
    const record = buildRecord(log.events);
    // The resection's start was not tapped: it is left out, not shown as still running.
    expect(record.phases.find((p) => p.name === 'resection')).toBeUndefined();
    expect(record.phases.find((p) => p.name === 'retrieval')).toMatchObject({ minutes: 10 });
  });
});

describe('idle gaps', () => {
  it('are pauses over ten minutes between consecutive events while the scope is in', () => {
    const log = caseLog();
    log.tap(0, 'scope_in', {});
    log.tap(10, 'marking', {}); // exactly ten minutes: not over
    log.tap(25, 'incision', {}); // 15 minutes
    log.tap(30, 'scope_out', {});
    log.tap(60, 'sign_out', {}); // the scope is out: not idle
    expect(buildRecord(log.events).idleGaps.map((g) => g.minutes)).toEqual([15]);
  });

  it('take their threshold from the options', () => {
    const log = scopedCase(20);
    log.tap(6, 'marking', {});
    log.close();
    expect(buildRecord(log.events, { idleGapMs: 5 * 60_000 }).idleGaps.map((g) => g.minutes)).toEqual([6, 14]);
  });
});
