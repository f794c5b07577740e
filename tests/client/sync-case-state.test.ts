import { describe, expect, it } from 'vitest';
import { buildCaseSnapshot, CaseState } from '@/sync/case-view.ts';
import { discardRemarkText, rebuildEvent } from '@/sync/corrections.ts';
import { buildEvent, buildStored } from '../factories/events.ts';

const caseId = '0195a1b2-0000-7000-8000-0000000000aa';

describe('what a tablet holds of a case', () => {
  it('asks from the highest contiguous sequence, so a missed broadcast is fetched again', () => {
    const c = new CaseState(caseId);
    c.absorb([buildStored('scope_in', { caseId, seq: 1 }), buildStored('marking', { caseId, seq: 2 })]);
    expect([c.contiguousSeq, c.hasGap]).toEqual([2, false]);
    c.absorb([buildStored('injection', { caseId, seq: 4 })]);
    expect([c.contiguousSeq, c.lastSeq, c.hasGap]).toEqual([2, 4, true]);
    c.absorb([buildStored('incision', { caseId, seq: 3 })]);
    expect([c.contiguousSeq, c.hasGap]).toEqual([4, false]);
  });

  it('keeps one copy of an event that arrives twice (broadcast and ack), and ignores another case', () => {
    const c = new CaseState(caseId);
    const e = buildStored('bleed', { caseId, seq: 1 });
    expect(c.absorb([e])).toHaveLength(1);
    expect(c.absorb([e, buildStored('bleed', { caseId: '0195a1b2-0000-7000-8000-0000000000bb', seq: 1 })])).toEqual([]);
    expect(c.stored.size).toBe(1);
  });

  it('moves a scheduled case to recording, and to closed at a sign-out', () => {
    const c = new CaseState(caseId);
    c.status = 'scheduled';
    c.absorb([buildStored('patient_in', { caseId, seq: 1 })]);
    expect(c.status).toBe('recording');
    c.absorb([buildStored('sign_out', { caseId, seq: 2 })]);
    expect(c.status).toBe('closed');
  });

  it('lists accepted events by sequence, then the tablet\'s own pending ones, never one twice', () => {
    const c = new CaseState(caseId);
    const a = buildStored('scope_in', { caseId, seq: 2 });
    const b = buildStored('patient_in', { caseId, seq: 1 });
    c.absorb([a, b]);
    const pendingDup = { id: a.id, event: a, state: 'sent' as const, seq: null, receivedAt: null, reason: null };
    const mine = buildEvent('marking', { caseId });
    const pending = { id: mine.id, event: mine, state: 'queued' as const, seq: null, receivedAt: null, reason: null };
    const snap = buildCaseSnapshot(c, [pendingDup, pending]);
    expect(snap.items.map((i) => [i.id, i.state])).toEqual([[b.id, 'accepted'], [a.id, 'accepted'], [mine.id, 'queued']]);
  });
});

describe('fixing and discarding a refused event', () => {
  it('rebuilds it with a new id and author, keeping the time of the tap', () => {
    const old = buildEvent('medication', { caseId, payload: { drug: 'midazolam' } });
    const fixed = rebuildEvent(old, { payload: { drug: 'midazolam', dose: 2, unit: 'mg' } }, { id: '0195a1b2-0000-7000-8000-0000000000cc', author: 'user-fixer' });
    expect(fixed).toMatchObject({ id: '0195a1b2-0000-7000-8000-0000000000cc', author: 'user-fixer', deviceTime: old.deviceTime, offsetMs: old.offsetMs, payload: { dose: 2 } });
  });

  it('refuses a fix that is still invalid, naming the field', () => {
    const old = buildEvent('haemostasis', { caseId, payload: { achieved: true } });
    expect(() => rebuildEvent(old, { payload: {} }, { id: '0195a1b2-0000-7000-8000-0000000000dd', author: 'u' })).toThrow(/achieved/);
  });

  it('words the discard remark with the event, the refusal and the reason, within the remark limit of 2,000 characters', () => {
    const e = buildEvent('remark', { caseId, payload: { text: 'z'.repeat(1_990) } });
    const text = discardRemarkText(e, 'The record of this case is closed', 'Written on paper instead');
    expect(text.length).toBeLessThanOrEqual(2_000); // shared/schemas/events.ts: remark text max 2000
    expect(discardRemarkText(buildEvent('bleed', { caseId }), 'Refused for a test', 'Duplicate of the other tablet'))
      .toMatch(/"Bleed".*Refused by the server: Refused for a test\. Why discarded: Duplicate of the other tablet\./);
  });
});
