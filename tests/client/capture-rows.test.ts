import { describe, expect, it } from 'vitest';
import { amendFields, createPayload } from '@/features/capture/amend.ts';
import { detailFields } from '@/features/capture/details.ts';
import { recentRows } from '@/features/capture/rows.ts';
import { at, buildEvent } from '../factories/events.ts';

const caseId = '0190b5a0-0000-7000-8000-000000000001';
const opts = { limit: 10, device: 'tablet-a', stateOf: () => 'accepted' as const };

describe('the amendment a quick sheet makes', () => {
  it('holds only the fields that changed and have a value', () => {
    const r = amendFields('bleed', detailFields.bleed!, { severity: 'ooze' }, { severity: 'ooze', vesselMm: 2 });
    expect(r).toEqual({ ok: true, fields: { vesselMm: 2 } });
  });

  it('is refused with the field named when the event could not hold it', () => {
    // shared/schemas/events.ts: an injection is at most 500 ml.
    const r = amendFields('injection', detailFields.injection!, {}, { volumeMl: 900 });
    expect(r.ok).toBe(false);
    expect(!r.ok && r.errors.volumeMl).toMatch(/^Volume: /);
  });

  it('needs the text of a remark before the remark exists', () => {
    expect(createPayload('remark', detailFields.remark!, {}, { text: '  ' })).toEqual({ ok: false, errors: { text: 'Remark is required' } });
    expect(createPayload('remark', detailFields.remark!, {}, { text: ' Scope changed ' })).toEqual({ ok: true, payload: { text: 'Scope changed' } });
  });
});

describe('the recent-events list', () => {
  it('lists taps newest first, with voids and amendments folded into the event they correct', () => {
    const clip = buildEvent('clip_fired', { caseId, deviceTime: at(1_000), payload: { outcome: 'deployed' } });
    const bleed = buildEvent('bleed', { caseId, deviceTime: at(2_000), device: 'tablet-b' });
    const amend = buildEvent('amend', { caseId, deviceTime: at(3_000), payload: { targetId: bleed.id, fields: { severity: 'spurting' } } });
    const undo = buildEvent('void', { caseId, deviceTime: at(4_000), payload: { targetId: clip.id, reason: 'undo' } });
    const rows = recentRows([clip, bleed, amend, undo], { ...opts, authorName: () => 'Daniel Kaur' });
    expect(rows.map((r) => [r.label, r.detail, r.voided, r.voidReason, r.amended, r.mine])).toEqual([
      ['Bleed', 'Spurting', false, null, true, false],
      ['Clip deployed', '', true, 'undo', false, true],
    ]);
    expect(rows[0]!.authorLabel).toBe('Daniel Kaur');
  });

  it('orders by corrected time even when the log arrives out of order', () => {
    const late = buildEvent('marking', { caseId, deviceTime: at(9_000) });
    const early = buildEvent('incision', { caseId, deviceTime: at(1_000), offsetMs: 20_000 }); // 21 s corrected
    expect(recentRows([early, late], opts).map((r) => r.kind)).toEqual(['incision', 'marking']);
  });

  it('draws at most the limit, newest kept', () => {
    const many = Array.from({ length: 25 }, (_, i) => buildEvent('dissection', { caseId, deviceTime: at(i * 1_000) }));
    const rows = recentRows(many, opts);
    expect(rows).toHaveLength(10);
    expect(rows[0]!.id).toBe(many[24]!.id);
  });
});
