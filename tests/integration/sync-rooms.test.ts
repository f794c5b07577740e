import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { and, asc, eq } from 'drizzle-orm';
import { auditLog } from '#server/db/schema/index.ts';
import { asBrowser, buildUnit, signIn } from './factories.ts';
import { createTestContext, type TestContext } from './helpers/app.ts';
import { join, newCase, push, recordedBy, signedInTeam, startNode, stopAll, tablet, tap, type SignedInTeam } from './sync-helpers.ts';

let t: TestContext;
let nodeA: string;
let nodeB: string;
let team: SignedInTeam;
beforeAll(async () => {
  t = await createTestContext();
  // Two server nodes over one database: rooms are shared through the Socket.IO Postgres adapter.
  const [a, b] = await Promise.all([startNode(t), startNode(t)]);
  nodeA = a.url;
  nodeB = b.url;
  team = await signedInTeam(t);
});
afterAll(async () => {
  await stopAll();
  await t?.close();
});

const eventually = <T>(check: () => T) => vi.waitFor(check, { timeout: 5_000, interval: 20 });

describe('case rooms', () => {
  it('tells the other tablets in the case what was stored, after commit, and neither the sender nor anyone outside the room', async () => {
    const caseId = await newCase(t, team);
    const elsewhere = await newCase(t, team);
    const [a, b, c] = await Promise.all([tablet(nodeA, team.cookies.nurse), tablet(nodeA, team.cookies.endoscopist), tablet(nodeA, team.cookies.supervisor)]);
    await Promise.all([join(a, caseId), join(b, caseId), join(c, elsewhere)]);
    const seenByA = recordedBy(a);
    const seenByB = recordedBy(b);
    const seenByC = recordedBy(c);
    const e = tap('bleed', caseId, team.members.nurse.id, { payload: { severity: 'spurting', vesselMm: 1 } });
    await push(a, caseId, [e]);
    await eventually(() => expect(seenByB).toEqual([{ caseId, events: [expect.objectContaining({ id: e.id, seq: 1, payload: { severity: 'spurting', vesselMm: 1 } })] }]));
    expect(seenByC).toEqual([]);
    // The sender has the results in its ack: the broadcast leaves it out.
    expect(seenByA).toEqual([]);
  });

  it('lets a tablet on node A see an event pushed on node B (Postgres adapter)', async () => {
    const caseId = await newCase(t, team);
    const onA = await tablet(nodeA, team.cookies.nurse);
    const onB = await tablet(nodeB, team.cookies.endoscopist);
    await Promise.all([join(onA, caseId), join(onB, caseId)]);
    const seenOnA = recordedBy(onA);
    const e = tap('clip_fired', caseId, team.members.endoscopist.id, { payload: { outcome: 'deployed', purpose: 'haemostasis' } });
    expect(await push(onB, caseId, [e])).toMatchObject({ results: [{ status: 'accepted', seq: 1 }] });
    await eventually(() => expect(seenOnA.flatMap((m) => m.events.map((x) => [x.id, x.seq]))).toEqual([[e.id, 1]]));
  });

  it('tells tablets on node A of a large push made on node B: every event once, in order, in messages of at most 100, as node B\'s own tablets hear it', async () => {
    const caseId = await newCase(t, team);
    const onA = await tablet(nodeA, team.cookies.nurse);
    const [sender, besideIt] = await Promise.all([tablet(nodeB, team.cookies.endoscopist), tablet(nodeB, team.cookies.supervisor)]);
    await Promise.all([join(onA, caseId), join(sender, caseId), join(besideIt, caseId)]);
    const [seenOnA, seenBySender, seenBeside] = [recordedBy(onA), recordedBy(sender), recordedBy(besideIt)];
    const batch = Array.from({ length: 250 }, (_, i) => tap('injection', caseId, team.members.endoscopist.id, { payload: { volumeMl: 1 + (i % 5) } }));
    expect((await push(sender, caseId, batch)).results.every((r: { status: string }) => r.status === 'accepted')).toBe(true);
    const all = (seen: typeof seenOnA) => seen.flatMap((m) => m.events);
    await eventually(() => expect(all(seenOnA)).toHaveLength(250));
    await eventually(() => expect(all(seenBeside)).toHaveLength(250));
    expect(all(seenOnA).map((e) => [e.id, e.seq])).toEqual(batch.map((e, i) => [e.id, i + 1]));
    expect(all(seenOnA)).toEqual(all(seenBeside));
    expect(seenOnA.map((m) => m.events.length)).toEqual([100, 100, 50]);
    expect(seenBySender).toEqual([]);
  });

  it('resumes after a reconnect from the last sequence held: only what came after it', async () => {
    const caseId = await newCase(t, team);
    const s = await tablet(nodeA, team.cookies.nurse);
    const first = [tap('patient_in', caseId, team.members.nurse.id), tap('scope_in', caseId, team.members.nurse.id)];
    await push(s, caseId, first);
    s.disconnect();
    const other = await tablet(nodeB, team.cookies.endoscopist);
    const missed = [tap('marking', caseId, team.members.endoscopist.id), tap('injection', caseId, team.members.endoscopist.id)];
    await push(other, caseId, missed);

    s.connect();
    await new Promise((resolve) => s.once('connect', () => resolve(null)));
    const ack = await join(s, caseId, 2);
    expect(ack).toMatchObject({ status: 'recording', lastSeq: 4, hasMore: false, events: missed.map((e, i) => ({ id: e.id, seq: i + 3 })) });
  });

  it('answers a long record page by page', async () => {
    const caseId = await newCase(t, team);
    const s = await tablet(nodeA, team.cookies.nurse);
    const many = Array.from({ length: 501 }, () => tap('coagulation', caseId, team.members.nurse.id));
    await push(s, caseId, many.slice(0, 500));
    await push(s, caseId, many.slice(500));
    const page1 = await join(s, caseId, 0);
    expect(page1).toMatchObject({ lastSeq: 501, hasMore: true, events: many.slice(0, 500).map((e, i) => ({ id: e.id, seq: i + 1 })) });
    const page2 = await join(s, caseId, 500);
    expect(page2).toMatchObject({ hasMore: false, events: [{ id: many[500]!.id, seq: 501 }] });
  });

  it('writes the reading of a whole record to the audit log', async () => {
    const caseId = await newCase(t, team);
    const s = await tablet(nodeA, team.cookies.supervisor);
    await join(s, caseId, 0);
    const res = await fetch(`${nodeA}/api/audit?entityType=case&entityId=${caseId}&action=record.view`, { headers: asBrowser(team.cookies.admin) });
    const body = await res.json() as { entries: { user: { id: string } | null; action: string }[] };
    expect(body.entries).toEqual([expect.objectContaining({ action: 'record.view', user: expect.objectContaining({ id: team.members.supervisor.id }) })]);
  });

  it('writes a socket\'s first join of a case to the audit log whatever it held before, once per socket', async () => {
    const caseId = await newCase(t, team);
    const nurse = await tablet(nodeA, team.cookies.nurse);
    await push(nurse, caseId, [tap('scope_in', caseId, team.members.nurse.id), tap('marking', caseId, team.members.nurse.id)]);
    const views = () => t.db.select().from(auditLog).where(and(eq(auditLog.entityId, caseId), eq(auditLog.action, 'record.view'), eq(auditLog.userId, team.members.supervisor.id)))
      .orderBy(asc(auditLog.id));
    const s = await tablet(nodeA, team.cookies.supervisor);
    expect(await join(s, caseId, 1)).toMatchObject({ events: [{ seq: 2 }] });
    await join(s, caseId, 2);
    expect(await views()).toEqual([expect.objectContaining({ unitId: team.unit.id, detail: { via: 'sync', afterSeq: 1, events: 1 } })]);
    // Another socket (a reload, a second tablet) is another reading.
    await join(await tablet(nodeB, team.cookies.supervisor), caseId, 2);
    expect((await views()).map((v) => v.detail)).toEqual([{ via: 'sync', afterSeq: 1, events: 1 }, { via: 'sync', afterSeq: 2, events: 0 }]);
  });
});

describe('the event log over HTTP', () => {
  it('takes a batch by POST with the same per-event answers, and broadcasts it to the room', async () => {
    const caseId = await newCase(t, team);
    const watcher = await tablet(nodeB, team.cookies.endoscopist);
    await join(watcher, caseId);
    const seen = recordedBy(watcher);
    const good = tap('scope_in', caseId, team.members.nurse.id);
    const bad = { ...tap('haemostasis', caseId, team.members.nurse.id), payload: {} };
    const res = await fetch(`${nodeA}/api/cases/${caseId}/events`, {
      method: 'POST', headers: { ...asBrowser(team.cookies.nurse), 'content-type': 'application/json' }, body: JSON.stringify({ events: [good, bad] }),
    });
    expect(res.status).toBe(200);
    expect(await res.json()).toMatchObject({ results: [{ id: good.id, status: 'accepted', seq: 1 }, { id: bad.id, status: 'refused', reason: expect.stringMatching(/payload\.achieved/) }] });
    await eventually(() => expect(seen.flatMap((m) => m.events.map((e) => e.id))).toEqual([good.id]));
  });

  it('reads the events after a sequence by GET, and refuses a supervisor\'s POST and another unit\'s reader', async () => {
    const caseId = await newCase(t, team);
    const s = await tablet(nodeA, team.cookies.nurse);
    const batch = [tap('patient_in', caseId, team.members.nurse.id), tap('scope_in', caseId, team.members.nurse.id), tap('scope_out', caseId, team.members.nurse.id)];
    await push(s, caseId, batch);
    const res = await fetch(`${nodeA}/api/cases/${caseId}/events?after=1`, { headers: asBrowser(team.cookies.supervisor) });
    expect(await res.json()).toMatchObject({ lastSeq: 3, hasMore: false, events: [{ id: batch[1]!.id, seq: 2 }, { id: batch[2]!.id, seq: 3 }] });

    const post = await fetch(`${nodeA}/api/cases/${caseId}/events`, {
      method: 'POST', headers: { ...asBrowser(team.cookies.supervisor), 'content-type': 'application/json' }, body: JSON.stringify({ events: [tap('marking', caseId, team.members.nurse.id)] }),
    });
    expect(post.status).toBe(403);
    const other = await signedInTeam(t);
    expect((await fetch(`${nodeA}/api/cases/${caseId}/events`, { headers: asBrowser(other.cookies.nurse) })).status).toBe(404);
    const badQuery = await fetch(`${nodeA}/api/cases/${caseId}/events?after=-4`, { headers: asBrowser(team.cookies.nurse) });
    expect(badQuery.status).toBe(400);
    expect(await badQuery.json()).toMatchObject({ issues: [{ path: 'after' }] });
  });

  it('writes every HTTP read that shows events to the audit log of the case\'s unit, not the reader\'s first one', async () => {
    const caseId = await newCase(t, team);
    const s = await tablet(nodeA, team.cookies.nurse);
    await push(s, caseId, [tap('scope_in', caseId, team.members.nurse.id), tap('marking', caseId, team.members.nurse.id)]);
    // The admin of another unit, also a supervisor here: their first (and active) unit is their own.
    const elsewhere = await buildUnit(t);
    await t.auth.api.addMember({ body: { userId: elsewhere.admin.id, organizationId: team.unit.id, role: 'supervisor' } });
    const cookie = await signIn(t, elsewhere.admin);
    for (const after of [1, 2]) {
      expect((await fetch(`${nodeA}/api/cases/${caseId}/events?after=${after}`, { headers: asBrowser(cookie) })).status).toBe(200);
    }
    const views = await t.db.select().from(auditLog).where(and(eq(auditLog.entityId, caseId), eq(auditLog.userId, elsewhere.admin.id)));
    // The read after 2 showed nothing and is not written.
    expect(views).toEqual([expect.objectContaining({ action: 'record.view', unitId: team.unit.id, detail: { via: 'events', after: 1, events: 1 } })]);
  });
});
