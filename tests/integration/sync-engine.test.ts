import 'fake-indexeddb/auto';
import { eq } from 'drizzle-orm';
import { v7 as uuidv7 } from 'uuid';
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { cases, events } from '#server/db/schema/index.ts';
import { createSyncEngine, createSyncSocket, type SyncEngine } from '@/sync/index.ts';
import { createTestContext, type TestContext } from './helpers/app.ts';
import { newCase, signedInTeam, startNode, stopAll, type SignedInTeam } from './sync-helpers.ts';

// The tablet's sync engine (src/sync) on fake IndexedDB, against the real server and PostgreSQL.

let t: TestContext;
let url: string;
let team: SignedInTeam;
beforeAll(async () => {
  t = await createTestContext();
  url = (await startNode(t)).url;
  team = await signedInTeam(t);
});
afterAll(async () => {
  await stopAll();
  await t?.close();
});

const engines: SyncEngine[] = [];
afterEach(async () => { await Promise.all(engines.splice(0).map((e) => e.stop())); });

function startTablet(cookie: string, author: string, dbName = `tablet-${uuidv7()}`, at = url): SyncEngine {
  const socket = createSyncSocket(at, { transports: ['websocket'], extraHeaders: { cookie }, reconnectionDelay: 50, reconnectionDelayMax: 200 });
  const engine = createSyncEngine({ socket, author, dbName, ackTimeoutMs: 5_000, retryDelaysMs: [50, 200] });
  engines.push(engine);
  return engine;
}
const eventually = <T>(check: () => T | Promise<T>) => vi.waitFor(check, { timeout: 8_000, interval: 20 });

describe('the sync engine against the server', () => {
  it('gets taps made offline into the record after a reload, each once, in the order tapped', async () => {
    const caseId = await newCase(t, team);
    const dbName = `tablet-${uuidv7()}`;
    const offline = startTablet(team.cookies.nurse, team.members.nurse.id, dbName, 'http://127.0.0.1:1');
    const taps = [
      await offline.recordTap({ caseId, kind: 'patient_in', payload: {} }),
      await offline.recordTap({ caseId, kind: 'scope_in', payload: {} }),
      await offline.recordTap({ caseId, kind: 'clip_fired', payload: { outcome: 'deployed', purpose: 'closure' } }),
    ];
    await offline.stop();

    const online = startTablet(team.cookies.nurse, team.members.nurse.id, dbName);
    await online.openCase(caseId);
    await eventually(() => expect(online.status.getSnapshot()).toMatchObject({ state: 'online', waiting: 0 }));
    const rows = await t.db.select({ id: events.id, seq: events.seq }).from(events).where(eq(events.caseId, caseId));
    expect(rows.sort((a, b) => a.seq - b.seq)).toEqual(taps.map((e, i) => ({ id: e.id, seq: i + 1 })));
    expect(online.caseView(caseId).getSnapshot()).toMatchObject({ status: 'recording', lastSeq: 3 });
  });

  it('shows a tap from the nurse\'s tablet on the endoscopist\'s, and keeps a refused one visible with its reason', async () => {
    const caseId = await newCase(t, team);
    const nurse = startTablet(team.cookies.nurse, team.members.nurse.id);
    const doctor = startTablet(team.cookies.endoscopist, team.members.endoscopist.id);
    await Promise.all([nurse.openCase(caseId), doctor.openCase(caseId)]);
    const bleed = await nurse.recordTap({ caseId, kind: 'bleed', payload: { severity: 'ooze' } });
    await eventually(() => expect(doctor.caseView(caseId).getSnapshot().items.map((i) => [i.id, i.state])).toEqual([[bleed.id, 'accepted']]));

    // A void naming an event of no case is refused by the server (rule: the target must be in this case).
    const stray = await nurse.recordTap({ caseId, kind: 'void', payload: { targetId: uuidv7(), reason: 'Wrong tap' } });
    await eventually(() => expect(nurse.status.getSnapshot().refused).toEqual([expect.objectContaining({ id: stray.id, reason: expect.stringMatching(/not in this case/) })]));
    expect(doctor.caseView(caseId).getSnapshot().items).toHaveLength(1);
  });

  it('marks every tap of a push refused when the user may not record (a supervisor), and stores none', async () => {
    const caseId = await newCase(t, team);
    const tablet = startTablet(team.cookies.supervisor, team.members.supervisor.id);
    await tablet.openCase(caseId);
    await tablet.recordTap({ caseId, kind: 'remark', payload: { text: 'Looks fine' } });
    await eventually(() => expect(tablet.status.getSnapshot().refused).toEqual([expect.objectContaining({ reason: expect.stringMatching(/may read this record but not record/) })]));
    const [row] = await t.db.select({ lastSeq: cases.lastSeq }).from(cases).where(eq(cases.id, caseId));
    expect(row?.lastSeq).toBe(0);
  });
});
