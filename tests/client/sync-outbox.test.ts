import { afterEach, describe, expect, it } from 'vitest';
import { SyncMessages } from '#shared/contracts/sync.ts';
import type { TapState } from '@/sync/index.ts';
import { eventually, newCaseId, newDbName, OFFLINE_URL, readOutboxRaw, rewriteOutboxRaw, startTablet, stopTablets } from './sync-helpers.ts';
import { startTestSyncServer, type TestSyncServer } from './sync-test-server.ts';

let server: TestSyncServer | undefined;
afterEach(async () => {
  await stopTablets();
  await server?.close();
  server = undefined;
});

describe('the outbox on the tablet (offline)', () => {
  it('shows a tap at once as saving, and resolves only after the strict IndexedDB write committed', async () => {
    const dbName = newDbName();
    const caseId = newCaseId();
    const tablet = startTablet(OFFLINE_URL, { dbName });
    const view = tablet.caseView(caseId);
    const seen: TapState[] = [];
    view.subscribe(() => { const s = view.getSnapshot().items[0]?.state; if (s && seen.at(-1) !== s) seen.push(s); });

    await tablet.ready;
    const tap = tablet.recordTap({ caseId, kind: 'scope_in', payload: {} });
    expect(view.getSnapshot().items.map((i) => i.state)).toEqual(['saving']); // within the call, before any write
    const event = await tap;

    expect(seen).toEqual(['saving', 'queued']);
    const rows = await readOutboxRaw(dbName);
    expect(rows.map((r) => [r.event.id, r.state])).toEqual([[event.id, 'queued']]);
    expect(tablet.status.getSnapshot().lastWrite?.durability).toBe('strict');
    expect(event).toMatchObject({ caseId, kind: 'scope_in', author: 'user-test-nurse', offsetMs: 0, offsetUncertaintyMs: null });
    expect(event.device).toBe(tablet.deviceId);
  });

  it('keeps queued taps across a reload, with the same device id, and counts them as waiting', async () => {
    const dbName = newDbName();
    const caseId = newCaseId();
    const first = startTablet(OFFLINE_URL, { dbName });
    const a = await first.recordTap({ caseId, kind: 'patient_in', payload: {} });
    const b = await first.recordTap({ caseId, kind: 'clip_fired', payload: { outcome: 'deployed', purpose: 'closure' } });
    const device = first.deviceId;
    await first.stop();

    const reloaded = startTablet(OFFLINE_URL, { dbName });
    await reloaded.ready;
    expect(reloaded.deviceId).toBe(device);
    expect(reloaded.status.getSnapshot()).toMatchObject({ state: 'offline', waiting: 2, refused: [] });
    await reloaded.openCase(caseId);
    expect(reloaded.caseView(caseId).getSnapshot().items.map((i) => [i.id, i.state])).toEqual([[a.id, 'queued'], [b.id, 'queued']]);
  });

  it('shows a queued tap that this version no longer takes as it is as refused, with the reason, never sending or hiding it', async () => {
    server = await startTestSyncServer();
    const dbName = newDbName();
    const caseId = newCaseId();
    const before = startTablet(OFFLINE_URL, { dbName });
    const kept = await before.recordTap({ caseId, kind: 'injection', payload: { agent: 'saline', volumeMl: 5 } });
    await before.stop();
    // As if an earlier version had taken a volume the payload rules now refuse (shared/schemas/events.ts: at most 500 ml).
    await rewriteOutboxRaw(dbName, (row) => ({ ...row, event: { ...(row.event as object), payload: { agent: 'saline', volumeMl: 5000 } } }));

    const after = startTablet(server.url, { dbName });
    await after.openCase(caseId);
    await eventually(() => expect(after.status.getSnapshot().connected).toBe(true));
    expect(after.status.getSnapshot().refused).toEqual([expect.objectContaining({ id: kept.id, reason: expect.stringContaining('payload.volumeMl') })]);
    expect(after.caseView(caseId).getSnapshot().items.map((i) => [i.id, i.state])).toEqual([[kept.id, 'refused']]);
    await after.pump();
    expect(server.pushes.flat()).toEqual([]);
    // A person decides: fixed, it goes as a new event, and the kept row leaves the outbox.
    const fixed = await after.resubmitRefused(kept.id, { payload: { agent: 'saline', volumeMl: 50 } });
    await eventually(() => expect(server!.log(caseId).map((e) => e.id)).toEqual([fixed.id]));
    await eventually(async () => expect(await readOutboxRaw(dbName)).toEqual([]));
  });

  it('refuses to take an invalid tap, shows nothing and stores nothing', async () => {
    const dbName = newDbName();
    const caseId = newCaseId();
    const tablet = startTablet(OFFLINE_URL, { dbName });
    // haemostasis needs `achieved` (shared/schemas/events.ts).
    await expect(tablet.recordTap({ caseId, kind: 'haemostasis', payload: {} as never })).rejects.toThrow(/achieved/);
    expect(tablet.caseView(caseId).getSnapshot().items).toEqual([]);
    expect(await readOutboxRaw(dbName)).toEqual([]);
  });
});

describe('sending what the outbox holds', () => {
  it('sends queued taps when the tablet comes online and drops them from the outbox once acknowledged', async () => {
    server = await startTestSyncServer();
    const dbName = newDbName();
    const caseId = newCaseId();
    const offline = startTablet(OFFLINE_URL, { dbName });
    const a = await offline.recordTap({ caseId, kind: 'scope_in', payload: {} });
    const b = await offline.recordTap({ caseId, kind: 'injection', payload: { agent: 'saline', volumeMl: 5 } });
    await offline.stop();

    const online = startTablet(server.url, { dbName });
    await online.openCase(caseId);
    await eventually(() => expect(online.status.getSnapshot()).toMatchObject({ state: 'online', waiting: 0 }));
    expect(server.log(caseId).map((e) => [e.id, e.seq])).toEqual([[a.id, 1], [b.id, 2]]);
    expect(online.caseView(caseId).getSnapshot().items.map((i) => [i.id, i.state, i.seq])).toEqual([[a.id, 'accepted', 1], [b.id, 'accepted', 2]]);
    await eventually(async () => expect(await readOutboxRaw(dbName)).toEqual([]));
    expect(server.pushes.flat()).toEqual([a.id, b.id]);
  });

  it('sends again when an ack is lost, and the server stores the event once (at-least-once, exactly-once effect)', async () => {
    server = await startTestSyncServer({ dropAcks: 1 });
    const caseId = newCaseId();
    const tablet = startTablet(server.url, { dbName: newDbName(), ackTimeoutMs: 200 });
    // The case is not opened, so no broadcast of the room can confirm the event: only an ack can.
    const e = await tablet.recordTap({ caseId, kind: 'bleed', payload: { severity: 'ooze' } });

    await eventually(() => expect(tablet.status.getSnapshot().waiting).toBe(0));
    expect(server.pushes.flat()).toEqual([e.id, e.id]);
    expect(server.log(caseId)).toHaveLength(1);
    expect(tablet.caseView(caseId).getSnapshot().items.map((i) => [i.state, i.seq])).toEqual([['accepted', 1]]);
  });

  it('shows the full timeline after a reload offline, from the events kept on the tablet', async () => {
    server = await startTestSyncServer();
    const dbName = newDbName();
    const caseId = newCaseId();
    const online = startTablet(server.url, { dbName });
    await online.openCase(caseId);
    await online.recordTap({ caseId, kind: 'patient_in', payload: {} });
    await online.recordTap({ caseId, kind: 'scope_in', payload: {} });
    await eventually(() => expect(online.status.getSnapshot().waiting).toBe(0));
    await online.stop();

    const offline = startTablet(OFFLINE_URL, { dbName });
    await offline.openCase(caseId);
    const snap = offline.caseView(caseId).getSnapshot();
    expect(snap.loaded).toBe(true);
    expect(snap.items.map((i) => [i.event.kind, i.state, i.seq])).toEqual([['patient_in', 'accepted', 1], ['scope_in', 'accepted', 2]]);
  });

  it('sends a tap that was saved while the previous push was still being written away, with nothing else to wake it', async () => {
    server = await startTestSyncServer();
    const caseId = newCaseId();
    const tablet = startTablet(server.url, { dbName: newDbName() });
    // Hold the IndexedDB write of accepted events, so the pump that sent the first tap is still busy
    // with it when the second tap is saved (white-box: the engine's own storage object).
    const storage = (tablet as unknown as { storage: { storeAccepted: (...a: unknown[]) => Promise<void> } }).storage;
    const write = storage.storeAccepted.bind(storage);
    let release!: () => void;
    const gate = new Promise<void>((r) => { release = r; });
    let held = 0;
    storage.storeAccepted = async (...a: unknown[]) => { held++; await gate; return write(...a); };

    const first = await tablet.recordTap({ caseId, kind: 'scope_in', payload: {} });
    await eventually(() => expect(held).toBe(1)); // acknowledged; its write waits
    const second = await tablet.recordTap({ caseId, kind: 'marking', payload: {} });
    release();
    await eventually(() => expect(server!.log(caseId).map((e) => e.id)).toEqual([first.id, second.id]));
    await eventually(() => expect(tablet.status.getSnapshot().waiting).toBe(0));
  });

  it('sends the taps of other cases while one case\'s pushes keep failing on the server', async () => {
    server = await startTestSyncServer();
    const stuck = newCaseId();
    const other = newCaseId();
    // Every push of `stuck` is answered 'internal' (a fault on the server), before the test server's own
    // handler, whose later answer is then ignored.
    server.io.on('connection', (s) => s.prependListener(SyncMessages.eventsPush, (msg: { caseId: string }, ack: (a: unknown) => void) => {
      if (msg.caseId === stuck) ack({ error: 'Something went wrong on the server; it has been logged', code: 'internal' });
    }));
    const dbName = newDbName();
    const tablet = startTablet(server.url, { dbName });
    const held = await tablet.recordTap({ caseId: stuck, kind: 'remark', payload: { text: 'first' } });
    const tap = await tablet.recordTap({ caseId: other, kind: 'scope_in', payload: {} });

    await eventually(() => expect(server!.log(other).map((e) => e.id)).toEqual([tap.id]), 3_000);
    // The failing case's tap is kept and counted as waiting, to be sent again after the back-off.
    expect(tablet.status.getSnapshot().waiting).toBe(1);
    expect((await readOutboxRaw(dbName)).map((r) => r.event.id)).toEqual([held.id]);
  });

  it('settles an event answered for again when the case already holds it (the app open twice on one tablet)', async () => {
    server = await startTestSyncServer({ dropAcks: 1 });
    const dbName = newDbName();
    const caseId = newCaseId();
    const offline = startTablet(OFFLINE_URL, { dbName });
    const x = await offline.recordTap({ caseId, kind: 'scope_in', payload: {} });
    await offline.stop();

    // Two pages over one IndexedDB database: b's push is stored but its answer is lost; a sends it too,
    // is answered 'duplicate', keeps it in the case's cache and clears the outbox.
    const b = startTablet(server.url, { dbName, ackTimeoutMs: 1_500 });
    await eventually(() => expect(server!.pushes.flat()).toEqual([x.id]));
    const a = startTablet(server.url, { dbName });
    await eventually(async () => expect(await readOutboxRaw(dbName)).toEqual([]));
    await a.stop();

    await b.openCase(caseId); // reads x from the cache, then b sends it again: 'duplicate'
    await eventually(() => expect(server!.pushes.flat()).toEqual([x.id, x.id, x.id]), 5_000);
    expect(server.log(caseId)).toHaveLength(1);
    await eventually(() => expect(b.status.getSnapshot().waiting).toBe(0));
    expect(b.caseView(caseId).getSnapshot().items.map((i) => [i.id, i.state])).toEqual([[x.id, 'accepted']]);
  });
});
