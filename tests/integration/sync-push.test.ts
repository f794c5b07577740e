import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { cases, events, session } from '#server/db/schema/index.ts';
import { caseAccess } from '#server/modules/events/access.ts';
import { eventsPageWithStatus } from '#server/modules/events/service.ts';
import { signIn } from './factories.ts';
import { createTestContext, type TestContext } from './helpers/app.ts';
import { join, newCase, push, signedInTeam, startNode, stopAll, tablet, tap, type SignedInTeam } from './sync-helpers.ts';

let t: TestContext;
let url: string;
let team: SignedInTeam;
let other: SignedInTeam;
beforeAll(async () => {
  t = await createTestContext();
  url = (await startNode(t)).url;
  [team, other] = await Promise.all([signedInTeam(t), signedInTeam(t)]);
});

/** A new case of the team, with the team's members and cookies under the names the tests use. */
async function caseWithTeam() {
  return { ...team, caseId: await newCase(t, team) };
}
afterAll(async () => {
  await stopAll();
  await t?.close();
});

const seqsOf = async (caseId: string) =>
  (await t.db.select({ id: events.id, seq: events.seq }).from(events).where(eq(events.caseId, caseId))).sort((a, b) => a.seq - b.seq);
const statusOf = async (caseId: string) => (await t.db.select({ status: cases.status, lastSeq: cases.lastSeq }).from(cases).where(eq(cases.id, caseId)))[0];

describe('pushing events over the socket', () => {
  it('stores a batch with sequences 1, 2, 3 in the order sent, and the first event starts the recording', async () => {
    const c = await caseWithTeam();
    const s = await tablet(url, c.cookies.nurse);
    const batch = [tap('patient_in', c.caseId, c.members.nurse.id), tap('sedation_start', c.caseId, c.members.nurse.id, { payload: { type: 'deep' } }), tap('scope_in', c.caseId, c.members.nurse.id)];
    const ack = await push(s, c.caseId, batch);
    expect(ack).toMatchObject({ results: batch.map((e, i) => ({ id: e.id, status: 'accepted', seq: i + 1 })) });
    expect(await seqsOf(c.caseId)).toEqual(batch.map((e, i) => ({ id: e.id, seq: i + 1 })));
    expect(await statusOf(c.caseId)).toEqual({ status: 'recording', lastSeq: 3 });
  });

  it('gives a join the case status as of its last sequence, not as the access check read it before a push', async () => {
    const c = await caseWithTeam();
    const s = await tablet(url, c.cookies.nurse);
    const before = await caseAccess(t.db, c.members.nurse.id, c.caseId);
    await push(s, c.caseId, [tap('patient_in', c.caseId, c.members.nurse.id)]);
    expect(before).toMatchObject({ status: 'scheduled', lastSeq: 0 });
    expect(await eventsPageWithStatus(t.db, c.caseId, 0)).toMatchObject({ status: 'recording', lastSeq: 1 });
    expect(await join(s, c.caseId, 0)).toMatchObject({ status: 'recording', lastSeq: 1 });
  });

  it('answers a repeated delivery as duplicate with the sequence given before, and stores it once', async () => {
    const c = await caseWithTeam();
    const s = await tablet(url, c.cookies.nurse);
    const e = tap('bleed', c.caseId, c.members.nurse.id, { payload: { severity: 'ooze' } });
    const first = await push(s, c.caseId, [e]);
    const again = await push(s, c.caseId, [e, e]);
    expect(first).toMatchObject({ results: [{ id: e.id, status: 'accepted', seq: 1 }] });
    expect(again).toMatchObject({ results: [{ id: e.id, status: 'duplicate', seq: 1 }, { id: e.id, status: 'duplicate', seq: 1 }] });
    expect(await seqsOf(c.caseId)).toEqual([{ id: e.id, seq: 1 }]);
  });

  it('counts an id sent twice in one push once', async () => {
    const c = await caseWithTeam();
    const s = await tablet(url, c.cookies.nurse);
    const e = tap('marking', c.caseId, c.members.nurse.id);
    expect(await push(s, c.caseId, [e, e])).toMatchObject({ results: [{ status: 'accepted', seq: 1 }, { status: 'duplicate', seq: 1 }] });
    expect(await statusOf(c.caseId)).toMatchObject({ lastSeq: 1 });
  });

  it('refuses an id already stored with different content, naming why', async () => {
    const c = await caseWithTeam();
    const s = await tablet(url, c.cookies.nurse);
    const e = tap('injection', c.caseId, c.members.nurse.id, { payload: { volumeMl: 5 } });
    await push(s, c.caseId, [e]);
    const ack = await push(s, c.caseId, [{ ...e, payload: { volumeMl: 8 } }]);
    expect(ack).toMatchObject({ results: [{ id: e.id, status: 'refused', reason: expect.stringMatching(/already used by a different event/) }] });
  });

  it('numbers batches that arrive out of order by arrival, and refuses a void whose target has not arrived yet', async () => {
    const c = await caseWithTeam();
    const s = await tablet(url, c.cookies.nurse);
    const n = c.members.nurse.id;
    const early = [tap('scope_in', c.caseId, n, { deviceTime: '2025-03-14T09:00:00.000Z' }), tap('marking', c.caseId, n, { deviceTime: '2025-03-14T09:01:00.000Z' })];
    const late = [tap('injection', c.caseId, n, { deviceTime: '2025-03-14T09:05:00.000Z' })];
    const voidEarly = tap('void', c.caseId, n, { payload: { targetId: early[1]!.id, reason: 'Tapped by mistake' } });

    const a = await push(s, c.caseId, [...late, voidEarly]);
    expect(a).toMatchObject({ results: [{ status: 'accepted', seq: 1 }, { status: 'refused', reason: expect.stringMatching(/not in this case/) }] });
    const b = await push(s, c.caseId, early);
    expect(b).toMatchObject({ results: [{ status: 'accepted', seq: 2 }, { status: 'accepted', seq: 3 }] });
    const retried = tap('void', c.caseId, n, { payload: { targetId: early[1]!.id, reason: 'Tapped by mistake' } });
    expect(await push(s, c.caseId, [retried])).toMatchObject({ results: [{ status: 'accepted', seq: 4 }] });
  });

  it('refuses each invalid event alone with a reason and stores the valid ones around it', async () => {
    const c = await caseWithTeam();
    const otherCase = { ...other, caseId: await newCase(t, other) };
    const s = await tablet(url, c.cookies.nurse);
    const n = c.members.nurse.id;
    const ok1 = tap('scope_in', c.caseId, n);
    const noAchieved = { ...tap('haemostasis', c.caseId, n), payload: { method: 'clip' } };
    const wrongCase = tap('marking', otherCase.caseId, n);
    const tooLarge = { ...tap('remark', c.caseId, n), payload: { text: 'x'.repeat(17_000) } };
    const strangerAuthor = tap('incision', c.caseId, otherCase.members.nurse.id);
    const ok2 = tap('scope_out', c.caseId, n);
    const ack = await push(s, c.caseId, [ok1, noAchieved, wrongCase, 42, tooLarge, strangerAuthor, ok2]);
    expect(ack).toMatchObject({ results: [
      { id: ok1.id, status: 'accepted', seq: 1 },
      { id: noAchieved.id, status: 'refused', reason: expect.stringMatching(/payload\.achieved/) },
      { id: wrongCase.id, status: 'refused', reason: expect.stringMatching(/belongs to case/) },
      { id: null, status: 'refused', reason: expect.stringMatching(/Invalid event/) },
      { id: tooLarge.id, status: 'refused', reason: expect.stringMatching(/at most 16384/) },
      { id: strangerAuthor.id, status: 'refused', reason: expect.stringMatching(/author is not a nurse or endoscopist/) },
      { id: ok2.id, status: 'accepted', seq: 2 },
    ] });
    expect((await seqsOf(c.caseId)).map((r) => r.id)).toEqual([ok1.id, ok2.id]);
  });

  it('closes the record at sign-out; after it only amendments are accepted', async () => {
    const c = await caseWithTeam();
    const s = await tablet(url, c.cookies.endoscopist);
    const n = c.members.endoscopist.id;
    const clip = tap('clip_fired', c.caseId, n, { payload: { outcome: 'deployed' } });
    const signOut = tap('sign_out', c.caseId, n, { payload: { items: [{ key: 'counts_reconciled', answer: 'yes' }] } });
    const late = tap('bleed', c.caseId, n);
    const ack = await push(s, c.caseId, [clip, signOut, late]);
    expect(ack).toMatchObject({ results: [{ status: 'accepted' }, { status: 'accepted' }, { status: 'refused', reason: expect.stringMatching(/closed; only amendments/) }] });
    expect(await statusOf(c.caseId)).toMatchObject({ status: 'closed' });

    const amend = tap('amend', c.caseId, n, { payload: { targetId: clip.id, fields: { purpose: 'closure' } } });
    const voidIt = tap('void', c.caseId, n, { payload: { targetId: clip.id, reason: 'wrong' } });
    expect(await push(s, c.caseId, [amend, voidIt])).toMatchObject({ results: [{ status: 'accepted', seq: 3 }, { status: 'refused' }] });
  });

  it('gives two tablets pushing at once unique, gap-free sequences', async () => {
    const c = await caseWithTeam();
    const [a, b] = await Promise.all([tablet(url, c.cookies.nurse), tablet(url, c.cookies.endoscopist)]);
    const batchesA = Array.from({ length: 5 }, () => Array.from({ length: 4 }, () => tap('clip_fired', c.caseId, c.members.nurse.id, { device: 'tablet-a', payload: { outcome: 'deployed' } })));
    const batchesB = Array.from({ length: 5 }, () => Array.from({ length: 4 }, () => tap('coagulation', c.caseId, c.members.endoscopist.id, { device: 'tablet-b' })));
    await Promise.all([...batchesA.map((x) => push(a, c.caseId, x)), ...batchesB.map((x) => push(b, c.caseId, x))]);
    const seqs = (await seqsOf(c.caseId)).map((r) => r.seq);
    expect(seqs).toEqual(Array.from({ length: 40 }, (_, i) => i + 1));
    expect(await statusOf(c.caseId)).toMatchObject({ lastSeq: 40 });
  });

  it('stores an event sent by two tablets at once exactly once: one is told accepted, the other duplicate, with one sequence', async () => {
    const c = await caseWithTeam();
    const [a, b] = await Promise.all([tablet(url, c.cookies.nurse), tablet(url, c.cookies.endoscopist)]);
    // A shared tablet's queued taps sent again by a colleague's tablet while the first push is in flight.
    const shared = Array.from({ length: 20 }, () => tap('injection', c.caseId, c.members.nurse.id, { payload: { volumeMl: 2 } }));
    const own = (k: number) => Array.from({ length: 5 }, () => tap('coagulation', c.caseId, c.members.endoscopist.id, { device: `tablet-${k}` }));
    const [ackA, ackB, ackOwn1, ackOwn2] = await Promise.all([push(a, c.caseId, shared), push(b, c.caseId, shared), push(a, c.caseId, own(1)), push(b, c.caseId, own(2))]);
    const stored = await seqsOf(c.caseId);
    expect(stored.map((r) => r.seq)).toEqual(Array.from({ length: 30 }, (_, i) => i + 1));
    const seqOf = new Map(stored.map((r) => [r.id, r.seq]));
    shared.forEach((e, i) => {
      const pair = [ackA.results[i], ackB.results[i]];
      expect(pair.map((r) => r.status).sort()).toEqual(['accepted', 'duplicate']);
      expect(pair.map((r) => r.seq)).toEqual([seqOf.get(e.id), seqOf.get(e.id)]);
    });
    expect([...ackOwn1.results, ...ackOwn2.results].every((r) => r.status === 'accepted')).toBe(true);
  });
});

describe('who may push', () => {
  it('lets a supervisor read the record but not record in it', async () => {
    const c = await caseWithTeam();
    const s = await tablet(url, c.cookies.supervisor);
    expect(await s.timeout(5_000).emitWithAck('case.join', { caseId: c.caseId, afterSeq: 0 })).toMatchObject({ caseId: c.caseId, events: [], lastSeq: 0 });
    const ack = await push(s, c.caseId, [tap('scope_in', c.caseId, c.members.nurse.id)]);
    expect(ack).toMatchObject({ code: 'forbidden', error: expect.stringMatching(/supervisor may read this record but not record/) });
    expect(await seqsOf(c.caseId)).toEqual([]);
  });

  it('refuses a user of another unit, to join or to push, as if the case did not exist', async () => {
    const c = await caseWithTeam();
    const member = other.members.nurse;
    const s = await tablet(url, other.cookies.nurse);
    expect(await s.timeout(5_000).emitWithAck('case.join', { caseId: c.caseId, afterSeq: 0 })).toMatchObject({ code: 'not_found' });
    expect(await push(s, c.caseId, [tap('scope_in', c.caseId, member.id)])).toMatchObject({ code: 'not_found', error: 'No such case in your unit' });
    expect(await seqsOf(c.caseId)).toEqual([]);
  });

  it('refuses a socket without a session at the handshake', async () => {
    await expect(tablet(url)).rejects.toMatchObject({ message: 'Sign in first', data: { code: 'unauthorized' } });
  });

  it('refuses a push once the socket\'s session has expired, though its socket is still open, and stores nothing', async () => {
    const c = await caseWithTeam();
    const cookie = await signIn(t, c.members.nurse); // a session of its own, so the team's stays valid
    const s = await tablet(url, cookie);
    expect(await push(s, c.caseId, [tap('scope_in', c.caseId, c.members.nurse.id)])).toMatchObject({ results: [{ status: 'accepted' }] });
    const token = decodeURIComponent(cookie.match(/session_token=([^;]+)/)![1]!).split('.')[0]!;
    await t.db.update(session).set({ expiresAt: new Date(Date.now() - 1_000) }).where(eq(session.token, token));
    expect(await push(s, c.caseId, [tap('marking', c.caseId, c.members.nurse.id)])).toMatchObject({ code: 'unauthorized' });
    expect(await s.timeout(5_000).emitWithAck('case.join', { caseId: c.caseId, afterSeq: 0 })).toMatchObject({ code: 'unauthorized' });
    expect((await seqsOf(c.caseId)).length).toBe(1);
  });

  it('checks the session again at each join: a signed-out session can no longer join or push', async () => {
    const c = await caseWithTeam();
    const cookie = await signIn(t, c.members.nurse); // a session of its own, so the team's stays valid
    const s = await tablet(url, cookie);
    await t.auth.api.signOut({ headers: new Headers({ cookie }) });
    expect(await s.timeout(5_000).emitWithAck('case.join', { caseId: c.caseId, afterSeq: 0 })).toMatchObject({ code: 'unauthorized' });
    expect(await push(s, c.caseId, [tap('scope_in', c.caseId, c.members.nurse.id)])).toMatchObject({ code: 'unauthorized' });
  });
});
