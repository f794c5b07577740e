import { describe, expect, it } from 'vitest';
import { buildRecord, COMPUTED_NOTE_CAUTION, UNSPECIFIED_ITEM } from '#shared/domain/record/index.ts';
import { caseLog, scopedCase } from './record-factories.ts';

// Reconciliation is PRODUCT.md's sign-out rule (opened = used + wasted); the time-out is in the spirit of
// the WHO Surgical Safety Checklist (PRODUCT.md); geometry as in geometry.test.ts. Figures by hand.

describe('device counts per catalogue item', () => {
  it('add opened and wasted quantities and count each use', () => {
    const log = scopedCase();
    log.tap(1, 'device_opened', { itemId: 'clip-9', quantity: 4 });
    log.tap(2, 'clip_fired', { itemId: 'clip-9', outcome: 'deployed', purpose: 'closure' });
    log.tap(3, 'clip_fired', { itemId: 'clip-9', outcome: 'misfired' });
    log.tap(4, 'clip_fired', { itemId: 'clip-9', outcome: 'deployed' });
    log.tap(5, 'device_wasted', { itemId: 'clip-9', reason: 'dropped' });
    log.tap(6, 'device_opened', { itemId: 'loop-3' });
    log.tap(7, 'loop_placed', { itemId: 'loop-3', sizeMm: 30 });
    log.tap(8, 'device_applied', { itemId: 'otsc-1' });
    log.close();
    expect(buildRecord(log.events).devices).toEqual([
      { itemId: 'clip-9', opened: 4, deployed: 2, misfired: 1, wasted: 1, inPatient: 2, unaccounted: 0, flagged: false },
      { itemId: 'loop-3', opened: 1, deployed: 1, misfired: 0, wasted: 0, inPatient: 1, unaccounted: 0, flagged: false },
      // Nothing opened: not flagged, though it does not reconcile.
      { itemId: 'otsc-1', opened: 0, deployed: 1, misfired: 0, wasted: 0, inPatient: 1, unaccounted: -1, flagged: false },
    ]);
  });

  it('keep events that name no item under "unspecified", listed last', () => {
    const log = scopedCase();
    log.tap(1, 'clip_fired', { outcome: 'deployed' });
    log.tap(2, 'device_opened', { itemId: 'a-item' });
    expect(buildRecord(log.events).devices.map((d) => d.itemId)).toEqual(['a-item', UNSPECIFIED_ITEM]);
  });

  it('flag an item opened but not used or wasted', () => {
    const log = scopedCase();
    log.tap(1, 'device_opened', { itemId: 'clip-9', quantity: 3 });
    log.tap(2, 'clip_fired', { itemId: 'clip-9', outcome: 'deployed' });
    const record = buildRecord(log.events);
    expect(record.devices[0]).toMatchObject({ unaccounted: 2, flagged: true });
    expect(record.flags).toEqual([expect.objectContaining({ code: 'device_unaccounted', ref: 'clip-9', message: 'device clip-9: 2 opened but not recorded as used or wasted' })]);
  });
});

describe('the counts', () => {
  it('count clips, loops, bleeds and injection volume', () => {
    const log = scopedCase();
    log.tap(1, 'injection', { volumeMl: 0.1 });
    log.tap(2, 'injection', { volumeMl: 0.2 });
    log.tap(3, 'injection', {});
    log.tap(4, 'clip_fired', { outcome: 'deployed' });
    log.tap(5, 'clip_fired', { outcome: 'misfired' });
    log.tap(6, 'loop_placed', {});
    log.tap(7, 'bleed', {});
    log.close();
    expect(buildRecord(log.events).counts).toMatchObject({
      injections: 3, injectionMl: 0.3, clipsDeployed: 1, clipsMisfired: 1, loopsPlaced: 1, bleeds: 1, bleedsOpen: 1,
    });
  });

  it('take en bloc and pieces from resection complete', () => {
    const log = scopedCase();
    log.tap(30, 'resection_complete', { enBloc: false, pieces: 3 });
    expect(buildRecord(log.events).resection).toEqual({ enBloc: false, pieces: 3 });
  });
});

describe('the time-out', () => {
  it('is present when recorded before the scope went in, with any item answered no', () => {
    const log = caseLog();
    log.tap(0, 'time_out', { items: [{ key: 'identity', answer: 'yes' }, { key: 'anticoagulants', answer: 'no' }] });
    log.tap(1, 'scope_in', {});
    const record = buildRecord(log.events);
    expect(record.timeOut).toMatchObject({ status: 'present', answeredNo: ['anticoagulants'] });
    expect(record.flags).toEqual([]);
  });

  it('is skipped with its reason, and flagged', () => {
    const log = caseLog();
    log.tap(0, 'time_out', { skipped: { reason: 'emergency bleed' } });
    log.tap(1, 'scope_in', {});
    const record = buildRecord(log.events);
    expect(record.timeOut).toMatchObject({ status: 'skipped', reason: 'emergency bleed' });
    expect(record.flags.map((f) => f.code)).toEqual(['time_out_skipped']);
  });

  it('is missing, and flagged once the scope is in', () => {
    const log = caseLog();
    expect(buildRecord(log.events).timeOut.status).toBe('missing');
    log.tap(1, 'scope_in', {});
    expect(buildRecord(log.events).flags.map((f) => f.code)).toEqual(['time_out_missing']);
  });

  it('is flagged when recorded after the scope went in', () => {
    const log = caseLog();
    log.tap(1, 'scope_in', {});
    log.tap(2, 'time_out', { items: [] });
    expect(buildRecord(log.events).flags.map((f) => f.code)).toEqual(['time_out_after_scope_in']);
  });
});

describe('the sign-out', () => {
  it('is flagged when recorded while the scope was in, not when the scope came out first or at the same moment', () => {
    const log = caseLog();
    log.tap(0, 'time_out', { items: [] });
    log.tap(1, 'scope_in', {});
    log.tap(20, 'sign_out', { items: [] });
    const early = buildRecord(log.events);
    expect(early.flags).toEqual([{ code: 'sign_out_scope_in', message: 'the sign-out was recorded while the scope was in', ref: early.signOut.eventId }]);

    const inOrder = caseLog();
    inOrder.tap(0, 'time_out', { items: [] });
    inOrder.tap(1, 'scope_in', {});
    inOrder.tap(20, 'scope_out', {});
    inOrder.tap(20, 'sign_out', { items: [] });
    expect(buildRecord(inOrder.events).flags).toEqual([]);
  });
});

describe('the specimen and the computed notes', () => {
  it('give the ellipse area and the resection speed', () => {
    const log = scopedCase();
    log.tap(0, 'marking', {});
    log.tap(60, 'resection_complete', {});
    log.tap(62, 'specimen_retrieved', { method: 'net', longMm: 40, shortMm: 30 });
    log.close();
    const record = buildRecord(log.events);
    // π/4 · 40 · 30 = 300π ≈ 942.48 mm²; over the 60-minute resection: 5π ≈ 15.71 mm²/min.
    expect(record.specimen.areaMm2).toBeCloseTo(300 * Math.PI, 9);
    expect(record.specimen.resectionSpeedMm2PerMin).toBeCloseTo(5 * Math.PI, 9);
    expect(record.notes.map((n) => n.kind)).toEqual(['specimen_area', 'resection_speed']);
  });

  it('put the defect perimeter beside a loop’s circumference, with the caution', () => {
    const log = scopedCase();
    log.tap(40, 'resection_complete', {});
    log.tap(41, 'specimen_retrieved', { longMm: 32, shortMm: 29 });
    log.tap(45, 'loop_placed', { sizeMm: 30 });
    const note = buildRecord(log.events).notes.find((n) => n.kind === 'defect_perimeter')!;
    // Ramanujan: π[3(16 + 14.5) − √((48 + 14.5)(16 + 43.5))] = π(91.5 − √3718.75) ≈ 95.89 mm (by hand);
    // the loop: π · 30 ≈ 94.25 mm.
    expect(note.values.defectPerimeterMm).toBeCloseTo(Math.PI * (91.5 - Math.sqrt(3718.75)), 9);
    expect(note.values.loop1CircumferenceMm).toBeCloseTo(30 * Math.PI, 9);
    expect(note.caution).toBe(COMPUTED_NOTE_CAUTION);
    expect(note.text).toContain('95.9 mm');
  });

  it('fall back to a muscle defect’s size when no specimen was measured', () => {
    const log = scopedCase();
    log.tap(30, 'muscle_defect', { dmiType: 3, sizeMm: 8 });
    log.tap(31, 'loop_placed', { sizeMm: 20 });
    const note = buildRecord(log.events).notes.find((n) => n.kind === 'defect_perimeter')!;
    expect(note.values.defectPerimeterMm).toBeCloseTo(8 * Math.PI, 9);
  });

  it('leave the area out when a specimen has only one axis', () => {
    const log = scopedCase();
    log.tap(41, 'specimen_retrieved', { longMm: 32 });
    expect(buildRecord(log.events).specimen).toEqual({ count: 1, areaMm2: null, resectionSpeedMm2PerMin: null });
  });
});
