import { afterEach, describe, expect, it } from 'vitest';
import type { AuditEntry } from '@/sync/outbox.ts';
import { openSyncStorage } from '@/sync/storage.ts';
import { buildEvent } from '../factories/events.ts';
import { eventually, newCaseId, newDbName, readOutboxRaw, startTablet, stopTablets } from './sync-helpers.ts';
import { startTestSyncServer, type TestSyncServer } from './sync-test-server.ts';

let server: TestSyncServer;
afterEach(async () => {
  await stopTablets();
  await server?.close();
});

/** The test server refuses any medication without a dose, and stores the rest. */
const refuseDoseless = () => startTestSyncServer({
  refuse: (e) => (e.kind === 'medication' && e.payload.dose === undefined ? 'A medication needs its dose' : null),
});

/** A tablet on a server that refuses doseless medication, holding one such tap, refused. */
async function refusedMedication(drug: string) {
  server = await refuseDoseless();
  const caseId = newCaseId();
  const tablet = startTablet(server.url, { dbName: newDbName() });
  await tablet.openCase(caseId);
  const bad = await tablet.recordTap({ caseId, kind: 'medication', payload: { drug } });
  await eventually(() => expect(tablet.status.getSnapshot().refused).toHaveLength(1));
  return { caseId, tablet, bad };
}

describe('refused events', () => {
  it('stay on the tablet with their reason, across a reload, while the others of the batch are stored', async () => {
    server = await refuseDoseless();
    const dbName = newDbName();
    const caseId = newCaseId();
    const tablet = startTablet(server.url, { dbName });
    await tablet.openCase(caseId);
    const ok = await tablet.recordTap({ caseId, kind: 'scope_in', payload: {} });
    const bad = await tablet.recordTap({ caseId, kind: 'medication', payload: { drug: 'midazolam' } });
    await eventually(() => expect(tablet.status.getSnapshot()).toMatchObject({ waiting: 0, refused: [{ id: bad.id, reason: 'A medication needs its dose' }] }));
    await tablet.stop();

    const reloaded = startTablet(server.url, { dbName });
    await reloaded.openCase(caseId);
    await eventually(() => expect(reloaded.status.getSnapshot().state).toBe('online'));
    const items = reloaded.caseView(caseId).getSnapshot().items;
    expect(items.map((i) => [i.id, i.state, i.reason])).toEqual([[ok.id, 'accepted', null], [bad.id, 'refused', 'A medication needs its dose']]);
    expect((await readOutboxRaw(dbName)).map((r) => r.state)).toEqual(['refused']);
    expect(server.pushes.flat().filter((id) => id === bad.id)).toHaveLength(1); // never sent again by itself
  });

  it('are fixed by sending a new event with a new id, keeping the time of the tap', async () => {
    const { caseId, tablet, bad } = await refusedMedication('midazolam');

    const fixed = await tablet.resubmitRefused(bad.id, { payload: { drug: 'midazolam', dose: 2, unit: 'mg', route: 'IV' } });
    await eventually(() => expect(tablet.status.getSnapshot()).toMatchObject({ waiting: 0, refused: [] }));
    expect(fixed.id).not.toBe(bad.id);
    expect(fixed.deviceTime).toBe(bad.deviceTime);
    expect(server.log(caseId).map((e) => e.id)).toEqual([fixed.id]);
    expect((await tablet.listAudit()).map((a) => [a.action, a.event.id, a.recordedAs])).toEqual([['replaced', bad.id, fixed.id]]);
  });

  it('are discarded only with a recorded remark saying what and why, and an audit entry on the tablet', async () => {
    const { caseId, tablet, bad } = await refusedMedication('fentanyl');

    await tablet.discardRefused(bad.id, 'Given before the case, already charted');
    await eventually(() => expect(tablet.status.getSnapshot()).toMatchObject({ waiting: 0, refused: [] }));
    const [remark] = server.log(caseId);
    expect(remark?.kind).toBe('remark');
    const text = remark?.kind === 'remark' ? remark.payload.text : '';
    expect(text).toContain(bad.id);
    expect(text).toContain('A medication needs its dose');
    expect(text).toContain('Given before the case, already charted');
    const audit = await tablet.listAudit();
    expect(audit.map((a) => [a.action, a.event.id, a.why, a.recordedAs])).toEqual([['discarded', bad.id, 'Given before the case, already charted', remark?.id]]);
  });

  it('cannot be discarded when the event is not a refused one', async () => {
    server = await refuseDoseless();
    const caseId = newCaseId();
    const tablet = startTablet(server.url, { dbName: newDbName() });
    const ok = await tablet.recordTap({ caseId, kind: 'scope_out', payload: {} });
    await expect(tablet.discardRefused(ok.id, 'no reason')).rejects.toThrow(/No refused event/);
  });

  it('are fixed once when "send again" is tapped twice in a row', async () => {
    const { caseId, tablet, bad } = await refusedMedication('midazolam');

    const fix = { payload: { drug: 'midazolam', dose: 2, unit: 'mg', route: 'IV' } };
    const [first, second] = await Promise.allSettled([tablet.resubmitRefused(bad.id, fix), tablet.resubmitRefused(bad.id, fix)]);
    expect(first.status).toBe('fulfilled');
    expect(second).toMatchObject({ status: 'rejected', reason: expect.objectContaining({ message: expect.stringContaining('already being fixed') }) });
    await eventually(() => expect(tablet.status.getSnapshot()).toMatchObject({ waiting: 0, refused: [] }));
    expect(server.log(caseId).filter((e) => e.kind === 'medication')).toHaveLength(1);
    expect((await tablet.listAudit()).filter((a) => a.event.id === bad.id)).toHaveLength(1);
  });

  it('are discarded with one remark when "discard" is tapped twice in a row', async () => {
    const { caseId, tablet, bad } = await refusedMedication('fentanyl');

    await Promise.allSettled([tablet.discardRefused(bad.id, 'Charted on paper'), tablet.discardRefused(bad.id, 'Charted on paper')]);
    await eventually(() => expect(tablet.status.getSnapshot()).toMatchObject({ waiting: 0, refused: [] }));
    expect(server.log(caseId).filter((e) => e.kind === 'remark')).toHaveLength(1);
  });

  it('are replaced in one IndexedDB transaction: if any part of it fails, the refused event stays as it was', async () => {
    const dbName = newDbName();
    const storage = openSyncStorage(dbName);
    try {
      const caseId = newCaseId();
      const refused = buildEvent('medication', { caseId, payload: { drug: 'midazolam' } });
      const fixed = buildEvent('medication', { caseId, payload: { drug: 'midazolam', dose: 2, unit: 'mg', route: 'IV' } });
      await storage.putOutbox({ event: refused, state: 'refused', reason: 'A medication needs its dose', attempts: 1, discardOf: null });
      // An audit entry IndexedDB cannot hold (a function): its write fails, and so must the others.
      const unstorable = { action: 'replaced', event: refused, reason: null, by: 'u', at: new Date(0).toISOString(), why: 'x', recordedAs: fixed.id, note: () => undefined } as unknown as AuditEntry;
      await expect(storage.putOutbox({ event: fixed, state: 'queued', reason: null, attempts: 0, discardOf: null }, { audit: unstorable, drop: refused.id })).rejects.toThrow();
      await expect(storage.settleRefused({ audit: unstorable, drop: refused.id })).rejects.toThrow();
      expect((await readOutboxRaw(dbName)).map((r) => [r.event.id, r.state])).toEqual([[refused.id, 'refused']]);
      expect(await storage.listAudit()).toEqual([]);
    } finally {
      await storage.close();
    }
  });
});
