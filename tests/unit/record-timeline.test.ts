import { describe, expect, it } from 'vitest';
import { v7 as uuidv7 } from 'uuid';
import { buildRecord, toRecordInput } from '#shared/domain/record/index.ts';
import { eventKinds, payloadSchemas, type NewEvent } from '#shared/schemas/events.ts';
import { caseLog, minutes, shuffled } from './record-factories.ts';

// The rules checked here are PRODUCT.md's ("The record": effective timeline, voids and amendments) and the
// reducer's own documented choices; no outside source is involved.

const kinds = (events: Parameters<typeof buildRecord>[0]) => buildRecord(events).timeline.map((e) => e.kind);

describe('the effective timeline', () => {
  it('orders events by corrected time, then by server sequence, then by id', () => {
    const log = caseLog();
    log.tap(2, 'dissection', {}, { seq: 5 });
    log.tap(1, 'incision', {}, { seq: 9 });
    log.tap(2, 'remark', { text: 'same minute, stored first' }, { seq: 3 });
    log.tap(2, 'image', {}, { seq: null, id: '00000000-0000-7000-8000-000000000002' });
    log.tap(2, 'marking', {}, { seq: null, id: '00000000-0000-7000-8000-000000000001' });
    expect(kinds(log.events)).toEqual(['incision', 'remark', 'dissection', 'marking', 'image']);
  });

  it('counts an event delivered twice once', () => {
    const log = caseLog();
    log.tap(1, 'clip_fired', { outcome: 'deployed' });
    const record = buildRecord([...log.events, ...log.events.map((e) => ({ ...e }))]);
    expect(record.counts.clipsDeployed).toBe(1);
    expect(record.problems).toEqual([]);
  });

  it('keeps the stored copy when a repeat differs, and says so', () => {
    const log = caseLog();
    const id = log.tap(1, 'injection', { volumeMl: 3 }, { seq: 4 });
    const record = buildRecord([{ ...log.events[0]!, seq: null, payload: { volumeMl: 30 } }, ...log.events]);
    expect(record.counts.injectionMl).toBe(3);
    expect(record.problems).toEqual([expect.objectContaining({ code: 'duplicate_conflict', eventId: id })]);
  });

  it('takes a tablet event with its corrected time (device time plus offset)', () => {
    const e: NewEvent = {
      id: uuidv7(), caseId: uuidv7(), deviceTime: '2025-03-04T08:00:00.000Z', offsetMs: 1500, offsetUncertaintyMs: 20,
      author: 'nurse-1', device: 'tablet-1', kind: 'scope_in', payload: {},
    };
    expect(toRecordInput(e)).toMatchObject({ atMs: Date.parse('2025-03-04T08:00:01.500Z'), seq: null });
    expect(toRecordInput({ ...e, seq: 7, receivedAt: '2025-03-04T08:00:02.000Z' }).seq).toBe(7);
  });

  it('keeps the same delivery of a repeat, whatever the order, when only its author or device differs, and says so', () => {
    const log = caseLog();
    const id = log.tap(0, 'scope_in', {}, { seq: null });
    const first = log.events[0]!;
    const other = { ...first, author: 'nurse-2' };
    const one = buildRecord([first, other]);
    expect(buildRecord([other, first])).toEqual(one);
    expect(one.problems).toEqual([expect.objectContaining({ code: 'duplicate_conflict', eventId: id })]);
  });
});

describe('voids', () => {
  it('take the voided event off the timeline and list it apart', () => {
    const log = caseLog();
    const clip = log.tap(1, 'clip_fired', { outcome: 'deployed' });
    const v = log.tap(2, 'void', { targetId: clip, reason: 'tapped twice' });
    const record = buildRecord(log.events);
    expect(record.counts.clipsDeployed).toBe(0);
    expect(record.voided).toEqual([expect.objectContaining({ id: clip, kind: 'clip_fired', voidedBy: [v] })]);
  });

  it('restore the target when the void itself is voided, and void it again at the third void', () => {
    const log = caseLog();
    const clip = log.tap(1, 'clip_fired', { outcome: 'deployed' });
    const v1 = log.tap(2, 'void', { targetId: clip, reason: 'wrong' });
    const v2 = log.tap(3, 'void', { targetId: v1, reason: 'the void was wrong' });
    expect(buildRecord(log.events).counts.clipsDeployed).toBe(1);
    log.tap(4, 'void', { targetId: v2, reason: 'it was right after all' });
    expect(buildRecord(log.events).counts.clipsDeployed).toBe(0);
  });

  it('report a void of an event not in the log, and one that names itself', () => {
    const log = caseLog();
    const ghost = uuidv7();
    log.tap(1, 'void', { targetId: ghost, reason: 'x' });
    const self = uuidv7({ msecs: minutes(2) });
    log.tap(2, 'void', { targetId: self, reason: 'x' }, { id: self });
    const codes = buildRecord(log.events).problems.map((p) => p.code).sort();
    expect(codes).toEqual(['self_target', 'unknown_target']);
  });

  it('settle a ring of voids naming each other by voiding nothing, and report it', () => {
    const log = caseLog();
    const clip = log.tap(1, 'clip_fired', { outcome: 'deployed' });
    const a = uuidv7({ msecs: minutes(2) });
    const b = uuidv7({ msecs: minutes(3) });
    log.tap(2, 'void', { targetId: b, reason: 'ring' }, { id: a });
    log.tap(3, 'void', { targetId: a, reason: 'ring' }, { id: b });
    log.tap(4, 'void', { targetId: clip, reason: 'real' });
    const record = buildRecord(log.events);
    expect(record.counts.clipsDeployed).toBe(0);
    expect(record.problems.filter((p) => p.code === 'void_cycle').map((p) => p.eventId).sort()).toEqual([a, b].sort());
  });

  it('withdraw the problem of a refused event once someone voids it', () => {
    const log = caseLog();
    const bad = log.raw(1, 'injection', { volumeMl: -2 });
    expect(buildRecord(log.events).problems.map((p) => p.code)).toEqual(['invalid_payload']);
    log.tap(2, 'void', { targetId: bad, reason: 'typed a minus' });
    expect(buildRecord(log.events).problems).toEqual([]);
  });
});

describe('amendments', () => {
  it('merge their fields into the target’s payload', () => {
    const log = caseLog();
    const inj = log.tap(1, 'injection', { agent: 'saline', volumeMl: 5 });
    const a = log.tap(2, 'amend', { targetId: inj, fields: { volumeMl: 8 } });
    const record = buildRecord(log.events);
    expect(record.timeline[0]).toMatchObject({ payload: { agent: 'saline', volumeMl: 8 }, amendedBy: [a] });
    expect(record.counts.injectionMl).toBe(8);
    expect(record.amendmentsApplied).toBe(1);
  });

  it('apply in order of corrected time then sequence, so the latest wins whatever the delivery order', () => {
    const log = caseLog();
    const inj = log.tap(1, 'injection', { volumeMl: 5 });
    log.tap(3, 'amend', { targetId: inj, fields: { volumeMl: 9 } }, { seq: 20 });
    log.tap(3, 'amend', { targetId: inj, fields: { volumeMl: 7 } }, { seq: 10 });
    log.tap(2, 'amend', { targetId: inj, fields: { volumeMl: 6, agent: 'saline' } });
    for (const seed of [1, 2, 3]) {
      expect(buildRecord(shuffled(log.events, seed)).timeline[0]!.payload).toEqual({ volumeMl: 9, agent: 'saline' });
    }
  });

  it('remove a field set to null', () => {
    const log = caseLog();
    const bleed = log.tap(1, 'bleed', { severity: 'spurting', vesselMm: 2 });
    log.tap(2, 'amend', { targetId: bleed, fields: { vesselMm: null } });
    expect(buildRecord(log.events).bleeds[0]).toMatchObject({ severity: 'spurting', vesselMm: null });
  });

  it('are reported and not applied when the merged payload is invalid for its kind', () => {
    const log = caseLog();
    const inj = log.tap(1, 'injection', { volumeMl: 5 });
    const bad = log.tap(2, 'amend', { targetId: inj, fields: { volumeMl: -1 } });
    const stray = log.tap(3, 'amend', { targetId: inj, fields: { colour: 'blue' } });
    const record = buildRecord(log.events);
    expect(record.counts.injectionMl).toBe(5);
    expect(record.problems.map((p) => [p.code, p.eventId])).toEqual([['invalid_amendment', bad], ['invalid_amendment', stray]].sort());
  });

  it('can bring a refused event onto the timeline by correcting it', () => {
    const log = caseLog();
    const bad = log.raw(1, 'loop_placed', { sizeMm: 0 });
    log.tap(2, 'amend', { targetId: bad, fields: { sizeMm: 30 } });
    const record = buildRecord(log.events);
    expect(record.counts.loopsPlaced).toBe(1);
    expect(record.problems).toEqual([]);
  });

  it('have no effect once voided, and are refused on voids and amendments', () => {
    const log = caseLog();
    const inj = log.tap(1, 'injection', { volumeMl: 5 });
    const a = log.tap(2, 'amend', { targetId: inj, fields: { volumeMl: 8 } });
    log.tap(3, 'void', { targetId: a, reason: 'amended the wrong event' });
    const onAmend = log.tap(4, 'amend', { targetId: a, fields: { x: 1 } });
    const record = buildRecord(log.events);
    expect(record.counts.injectionMl).toBe(5);
    expect(record.problems).toEqual([expect.objectContaining({ code: 'not_amendable', eventId: onAmend })]);
  });
});

describe('bad events', () => {
  it('are reported one by one, with the field at fault, and never thrown', () => {
    const log = caseLog();
    const unknown = log.raw(1, 'teleport', {});
    const invalid = log.raw(2, 'clip_fired', { outcome: 'sideways' });
    const strict = log.raw(3, 'scope_in', { extra: true });
    const record = buildRecord([...log.events, 'not an event', { id: 7 }, { id: 'x', kind: 'scope_in' }]);
    const byId = Object.fromEntries(record.problems.filter((p) => p.eventId).map((p) => [p.eventId, p]));
    expect(byId[unknown]).toMatchObject({ code: 'unknown_kind' });
    expect(byId[invalid]!.message).toContain('outcome');
    expect(byId[strict]!.message).toContain('extra');
    expect(record.problems.filter((p) => p.code === 'malformed_event')).toHaveLength(3);
    expect(record.timeline).toEqual([]);
  });

  it('are judged alike with an empty payload, whatever the kind, as its schema judges them', () => {
    // The check skips the schema for `{}` where the schema takes it unchanged: the answers must not differ.
    for (const kind of eventKinds) {
      const log = caseLog();
      const id = log.raw(1, kind, {});
      const record = buildRecord(log.events);
      const parsed = payloadSchemas[kind].safeParse({});
      expect(record.timeline.find((e) => e.id === id)?.payload ?? null, kind).toEqual(parsed.success ? parsed.data : null);
      expect(record.problems.some((p) => p.eventId === id && p.code === 'invalid_payload'), kind).toBe(!parsed.success);
    }
    // Not a plain object, or with a key zod reads: the schema decides.
    const log = caseLog();
    const inherited = log.raw(1, 'marking', Object.create({ extra: true }) as Record<string, unknown>);
    const withKey = log.raw(2, 'incision', { extra: 1 });
    const problems = buildRecord(log.events).problems.map((p) => [p.eventId, p.code]);
    expect(problems).toEqual(expect.arrayContaining([[inherited, 'invalid_payload'], [withKey, 'invalid_payload']]));
  });

  it('leave a record even when the log is not a list', () => {
    expect(buildRecord('nonsense').problems).toEqual([expect.objectContaining({ code: 'malformed_event' })]);
  });
});
