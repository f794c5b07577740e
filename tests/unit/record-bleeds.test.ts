import { describe, expect, it } from 'vitest';
import { v7 as uuidv7 } from 'uuid';
import { buildRecord } from '#shared/domain/record/index.ts';
import { minutes, scopedCase } from './record-factories.ts';

// Episode rules are PRODUCT.md's ("Bleed episodes") as the reducer documents them; times worked by hand.

describe('a bleed episode', () => {
  it('runs from the bleed to the haemostasis achieved, with seconds to haemostasis', () => {
    const log = scopedCase();
    const bleed = log.tap(10, 'bleed', { severity: 'spurting', vesselMm: 2 });
    log.tap(11, 'haemostasis', { method: 'coagulation_forceps', achieved: false });
    log.tap(12.5, 'haemostasis', { method: 'clip', achieved: true });
    log.close();
    expect(buildRecord(log.events).bleeds).toEqual([expect.objectContaining({
      bleedId: bleed, severity: 'spurting', vesselMm: 2, secondsToHaemostasis: 150, attempts: 2,
      methods: ['coagulation_forceps', 'clip'], openAtScopeOut: false,
    })]);
  });

  it('counts deployed haemostasis clips as attempts and clips, and coagulations as used', () => {
    const log = scopedCase();
    log.tap(10, 'bleed', {});
    log.tap(10.5, 'coagulation', {});
    log.tap(11, 'clip_fired', { outcome: 'deployed', purpose: 'haemostasis' });
    log.tap(11.2, 'clip_fired', { outcome: 'misfired', purpose: 'haemostasis' }); // a misfire is no attempt
    log.tap(11.5, 'clip_fired', { outcome: 'deployed', purpose: 'closure' }); // not for the bleed
    log.tap(12, 'haemostasis', { method: 'clip', achieved: true });
    log.tap(13, 'clip_fired', { outcome: 'deployed', purpose: 'haemostasis' }); // after control: prophylactic
    log.close();
    const [ep] = buildRecord(log.events).bleeds;
    expect(ep).toMatchObject({ attempts: 2, clips: 1, coagulations: 1 });
  });

  it('is closed by the haemostasis that names it, even when a later bleed is open', () => {
    const log = scopedCase();
    const first = log.tap(10, 'bleed', {});
    const second = log.tap(11, 'bleed', {});
    log.tap(12, 'haemostasis', { achieved: true, bleedId: first });
    log.tap(14, 'haemostasis', { achieved: true });
    log.close();
    const bleeds = buildRecord(log.events).bleeds;
    expect(bleeds.map((b) => [b.bleedId, b.secondsToHaemostasis])).toEqual([[first, 120], [second, 180]]);
  });

  it('is closed by the most recent open bleed when the haemostasis names none', () => {
    const log = scopedCase();
    log.tap(10, 'bleed', {});
    const later = log.tap(11, 'bleed', {});
    log.tap(12, 'haemostasis', { achieved: true });
    log.close();
    const bleeds = buildRecord(log.events).bleeds;
    expect(bleeds.find((b) => b.bleedId === later)!.controlledMs).not.toBeNull();
    expect(bleeds.filter((b) => b.controlledMs === null)).toHaveLength(1);
  });

  it('is flagged when still open as the scope comes out for the last time', () => {
    const log = scopedCase();
    const bleed = log.tap(50, 'bleed', { severity: 'ooze' });
    log.close();
    const record = buildRecord(log.events);
    expect(record.bleeds[0]).toMatchObject({ openAtScopeOut: true, controlledMs: null, secondsToHaemostasis: null });
    expect(record.counts).toMatchObject({ bleeds: 1, bleedsOpen: 1 });
    expect(record.flags).toEqual([expect.objectContaining({ code: 'bleed_open_at_scope_out', ref: bleed })]);
  });

  it('is not flagged while the scope is still in', () => {
    const log = scopedCase();
    log.tap(50, 'bleed', {});
    expect(buildRecord(log.events).bleeds[0]!.openAtScopeOut).toBe(false);
  });

  it('reports a haemostasis that names no bleed on the record and links it to the open one', () => {
    const log = scopedCase();
    const bleed = log.tap(10, 'bleed', {});
    const h = log.tap(11, 'haemostasis', { achieved: true, bleedId: uuidv7() });
    log.close();
    const record = buildRecord(log.events);
    expect(record.bleeds[0]).toMatchObject({ bleedId: bleed, controlledBy: h });
    expect(record.problems).toEqual([expect.objectContaining({ code: 'unknown_bleed', eventId: h })]);
  });

  it('ignores a haemostasis with no bleed open (prophylactic treatment)', () => {
    const log = scopedCase();
    log.tap(10, 'haemostasis', { method: 'coagulation_forceps', achieved: true });
    log.close();
    const record = buildRecord(log.events);
    expect(record.bleeds).toEqual([]);
    expect(record.counts.haemostasisAttempts).toBe(0);
  });

  it('is not closed by a haemostasis that names another bleed, already controlled (a second tablet\'s tap for it)', () => {
    const log = scopedCase();
    const a = log.tap(10, 'bleed', { severity: 'ooze' });
    const b = log.tap(11, 'bleed', { severity: 'spurting' });
    log.tap(12, 'haemostasis', { method: 'clip', achieved: true, bleedId: a });
    const again = log.tap(12.1, 'haemostasis', { method: 'clip', achieved: true, bleedId: a });
    log.close();
    const record = buildRecord(log.events);
    expect(record.bleeds.find((x) => x.bleedId === a)).toMatchObject({ attempts: 1, secondsToHaemostasis: 120 });
    expect(record.bleeds.find((x) => x.bleedId === b)).toMatchObject({ controlledMs: null, controlledBy: null, attempts: 0, openAtScopeOut: true });
    expect(record.flags).toEqual([expect.objectContaining({ code: 'bleed_open_at_scope_out', ref: b })]);
    expect(record.problems).toEqual([expect.objectContaining({ code: 'unknown_bleed', eventId: again, message: expect.stringContaining('already controlled') })]);
  });

  it('reports a haemostasis that names no bleed on the record while none is open, and links it to none', () => {
    const log = scopedCase();
    const h = log.tap(11, 'haemostasis', { achieved: true, bleedId: uuidv7() });
    log.close();
    const record = buildRecord(log.events);
    expect(record.bleeds).toEqual([]);
    expect(record.problems).toEqual([expect.objectContaining({ code: 'unknown_bleed', eventId: h, message: expect.stringContaining('linked to none') })]);
  });

  it('is closed by the haemostasis that names it when that tap sorts a moment before the bleed (two tablets\' clocks)', () => {
    const log = scopedCase();
    const older = log.tap(10, 'bleed', { severity: 'ooze' });
    const named = log.tap(12, 'bleed', { severity: 'spurting' }, { author: 'nurse-2' });
    const h = log.tap(11.995, 'haemostasis', { method: 'clip', achieved: true, bleedId: named }); // 300 ms earlier, corrected
    log.close();
    const record = buildRecord(log.events);
    expect(record.bleeds.find((b) => b.bleedId === named)).toMatchObject({ controlledBy: h, controlledMs: minutes(12), secondsToHaemostasis: 0, attempts: 1, methods: ['clip'] });
    expect(record.bleeds.find((b) => b.bleedId === older)).toMatchObject({ controlledMs: null, attempts: 0, openAtScopeOut: true });
    expect(record.flags.filter((f) => f.code === 'bleed_open_at_scope_out').map((f) => f.ref)).toEqual([older]);
    expect(record.problems).toEqual([expect.objectContaining({ code: 'unknown_bleed', eventId: h, message: expect.stringContaining('recorded after it') })]);
  });

  it('is not closed by a haemostasis naming a bleed that is voided, which goes to the open bleed and is reported', () => {
    const log = scopedCase();
    const open = log.tap(10, 'bleed', {});
    const wrong = log.tap(12, 'bleed', {});
    log.tap(12.5, 'void', { targetId: wrong, reason: 'tapped in error' });
    const h = log.tap(11, 'haemostasis', { achieved: true, bleedId: wrong });
    log.close();
    const record = buildRecord(log.events);
    expect(record.bleeds.map((b) => [b.bleedId, b.controlledBy])).toEqual([[open, h]]);
    expect(record.problems).toEqual([expect.objectContaining({ code: 'unknown_bleed', eventId: h, message: expect.stringContaining('no bleed on the record') })]);
  });
});
