import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { MAX_PUSH_BYTES } from '#shared/contracts/sync.ts';
import { asBrowser } from './factories.ts';
import { createTestContext, type TestContext } from './helpers/app.ts';
import { join, newCase, newId, push, recordedBy, signedInTeam, startNode, stopAll, tablet, tap, type SignedInTeam } from './sync-helpers.ts';

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

/** Emit anything at all, as a misbehaving client could, and wait for the ack. */
const raw = (s: Awaited<ReturnType<typeof tablet>>, name: string, ...args: unknown[]) => rawWithin(5_000, s, name, ...args);
const rawWithin = (ms: number, s: Awaited<ReturnType<typeof tablet>>, name: string, ...args: unknown[]) =>
  (s.timeout(ms) as unknown as { emitWithAck(n: string, ...a: unknown[]): Promise<unknown> }).emitWithAck(name, ...args);

describe('bad input on the socket', () => {
  it('answers a malformed push with an error naming the field, to the sender only', async () => {
    const caseId = await newCase(t, team);
    const s = await tablet(url, team.cookies.nurse);
    expect(await raw(s, 'events.push', { caseId: 'not-a-uuid', events: [] })).toMatchObject({
      code: 'bad_request', error: expect.stringMatching(/^Invalid events\.push: caseId/),
      issues: expect.arrayContaining([expect.objectContaining({ path: 'caseId' }), expect.objectContaining({ path: 'events' })]),
    });
    expect(await raw(s, 'events.push', { caseId, events: 'scope_in' })).toMatchObject({ code: 'bad_request', issues: [{ path: 'events' }] });
    expect(await raw(s, 'events.push', 'hello')).toMatchObject({ code: 'bad_request' });
    expect(await raw(s, 'events.push', { caseId, events: [] }, 'extra')).toMatchObject({ code: 'bad_request', error: expect.stringMatching(/one message object/) });
    expect(await raw(s, 'case.join', { caseId, afterSeq: -1 })).toMatchObject({ code: 'bad_request', issues: [{ path: 'afterSeq' }] });
    expect(await raw(s, 'clock.ping', { t1: 'noon' })).toMatchObject({ code: 'bad_request', issues: [{ path: 't1' }] });
  });

  it('refuses a push of more than 500 events as a whole', async () => {
    const caseId = await newCase(t, team);
    const s = await tablet(url, team.cookies.nurse);
    const many = Array.from({ length: 501 }, () => tap('coagulation', caseId, team.members.nurse.id));
    expect(await push(s, caseId, many)).toMatchObject({ code: 'bad_request', issues: [{ path: 'events', message: 'At most 500 events in one push' }] });
  });

  it('answers a push above the size limit with too_large, and the socket keeps working', async () => {
    const caseId = await newCase(t, team);
    const s = await tablet(url, team.cookies.nurse);
    const filler = Array.from({ length: 70 }, () => ({ ...tap('remark', caseId, team.members.nurse.id), payload: { text: 'y'.repeat(16_000) } }));
    const ack = await push(s, caseId, filler);
    expect(ack).toMatchObject({ code: 'too_large', error: expect.stringMatching(new RegExp(`at most ${MAX_PUSH_BYTES}`)) });
    expect(await push(s, caseId, [tap('scope_in', caseId, team.members.nurse.id)])).toMatchObject({ results: [{ status: 'accepted', seq: 1 }] });
  });

  it('drops only the socket that sends a message beyond the transport limit; the server and other tablets go on', async () => {
    const caseId = await newCase(t, team);
    const [rude, polite] = await Promise.all([tablet(url, team.cookies.nurse), tablet(url, team.cookies.endoscopist)]);
    const closed = new Promise<string>((resolve) => rude.once('disconnect', (reason) => resolve(reason)));
    rude.emit('events.push', { caseId, events: ['z'.repeat(3 * MAX_PUSH_BYTES)] } as never, () => {});
    expect(await closed).toMatch(/transport/);
    expect(await push(polite, caseId, [tap('scope_in', caseId, team.members.endoscopist.id)])).toMatchObject({ results: [{ status: 'accepted' }] });
    const fresh = await tablet(url, team.cookies.nurse);
    expect(await join(fresh, caseId)).toMatchObject({ lastSeq: 1 });
  });

  it('ignores a message without an ack, an unknown message name, and goes on answering', async () => {
    const caseId = await newCase(t, team);
    const s = await tablet(url, team.cookies.nurse);
    const untyped = s as unknown as { emit(n: string, m: unknown): void };
    untyped.emit('events.push', { caseId, events: [tap('scope_in', caseId, team.members.nurse.id)] });
    untyped.emit('events.delete', { caseId });
    expect(await rawWithin(500, s, 'events.delete', { caseId }).catch((e: Error) => e.message)).toMatch(/timed out/);
    expect(await join(s, caseId)).toMatchObject({ lastSeq: 0, events: [] });
  });
});

describe('values the database cannot store as sent', () => {
  it('refuses alone an event with a NUL character or a broken character in its text, and stores the others', async () => {
    const caseId = await newCase(t, team);
    const s = await tablet(url, team.cookies.nurse);
    const nurse = team.members.nurse.id;
    const withNul = { ...tap('remark', caseId, nurse), payload: { text: 'before\u0000after' } };
    // Half of a surrogate pair: JSON carries it as \ud800, PostgreSQL has no character for it.
    const halfPair = { ...tap('remark', caseId, nurse), payload: { text: 'clip \ud800' } };
    const nulInName = { ...tap('remark', caseId, nurse), payload: { ['te\u0000xt']: 'x' } };
    const fine = [tap('scope_in', caseId, nurse), tap('remark', caseId, nurse, { payload: { text: 'ok \u{1F600}' } })];
    const ack = await push(s, caseId, [fine[0], withNul, halfPair, nulInName, fine[1]]);
    expect(ack).toEqual({ results: [
      expect.objectContaining({ id: fine[0]!.id, status: 'accepted', seq: 1 }),
      { id: withNul.id, status: 'refused', reason: expect.stringMatching(/^Invalid event: payload\.text: contains a NUL character/) },
      { id: halfPair.id, status: 'refused', reason: expect.stringMatching(/^Invalid event: payload\.text: .*broken character/) },
      { id: nulInName.id, status: 'refused', reason: expect.stringMatching(/^Invalid event: payload: a field name contains a NUL/) },
      expect.objectContaining({ id: fine[1]!.id, status: 'accepted', seq: 2 }),
    ] });
    expect(await join(s, caseId)).toMatchObject({ lastSeq: 2, events: [{ id: fine[0]!.id }, { id: fine[1]!.id, payload: { text: 'ok \u{1F600}' } }] });
  });

  it('refuses alone an amendment nested too deeply, over the socket and over HTTP, and a socket message too deep to read', async () => {
    const caseId = await newCase(t, team);
    const s = await tablet(url, team.cookies.nurse);
    const nurse = team.members.nurse.id;
    const target = tap('remark', caseId, nurse, { payload: { text: 'first' } });
    let deep: unknown = 'x';
    for (let i = 0; i < 20; i++) deep = { deeper: deep };
    const tooDeep = tap('amend', caseId, nurse, { payload: { targetId: target.id, fields: { text: deep } } });
    const ack = await push(s, caseId, [target, tooDeep]);
    expect(ack).toMatchObject({ results: [
      { status: 'accepted', seq: 1 },
      { status: 'refused', reason: expect.stringMatching(/^Invalid event: payload\.fields\.text(\.deeper)+: nested more than 12 levels deep/) },
    ] });
    // The same amendment sent again: still refused with its reason (a deep repeat was never compared).
    expect(await push(s, caseId, [tooDeep])).toMatchObject({ results: [{ status: 'refused', reason: expect.stringMatching(/nested more than 12/) }] });

    // Over HTTP, ten thousand levels (JSON.stringify overflows its stack long before that).
    const levels = 10_000;
    const body = `{"events":[${JSON.stringify(tap('remark', caseId, nurse)).slice(0, -1)},"extra":${'['.repeat(levels)}${']'.repeat(levels)}}]}`;
    const res = await fetch(`${url}/api/cases/${caseId}/events`, { method: 'POST', headers: { ...asBrowser(team.cookies.nurse), 'content-type': 'application/json' }, body });
    expect(res.status).toBe(200);
    expect(await res.json()).toMatchObject({ results: [{ status: 'refused', reason: expect.stringMatching(/nested more than 12 levels deep/) }] });

    // The socket: the packet is written by hand (the client's own encoder could not stringify it).
    const answers: string[] = [];
    s.io.engine.on('message', (data) => { if (typeof data === 'string' && data.startsWith('3777')) answers.push(data); });
    s.io.engine.send(`2777["events.push",{"caseId":"${caseId}","events":[${'['.repeat(levels)}${']'.repeat(levels)}]}]`);
    await vi.waitFor(() => expect(answers).toHaveLength(1), { timeout: 5_000, interval: 20 });
    expect(JSON.parse(answers[0]!.slice(4))).toEqual([{ code: 'bad_request', error: 'The events.push message is nested too deeply to read' }]);
    expect(await join(s, caseId)).toMatchObject({ lastSeq: 1 });
  });

  it('takes case and event ids in capitals as the same ids in lower case', async () => {
    const caseId = await newCase(t, team);
    const [s, other] = await Promise.all([tablet(url, team.cookies.nurse), tablet(url, team.cookies.endoscopist)]);
    await join(other, caseId);
    const heard = recordedBy(other);
    const nurse = team.members.nurse.id;
    const first = tap('scope_in', caseId.toUpperCase(), nurse, { id: newId().toUpperCase() });
    const voided = tap('void', caseId.toUpperCase(), nurse, { payload: { targetId: first.id, reason: 'tapped by mistake' } });
    const ack = await push(s, caseId.toUpperCase(), [first, voided]);
    expect(ack).toMatchObject({ results: [{ id: first.id.toLowerCase(), status: 'accepted', seq: 1 }, { status: 'accepted', seq: 2 }] });
    // Sent again with its id in capitals: a repeat of the stored event, not a new one and not a fault.
    expect(await push(s, caseId, [first])).toMatchObject({ results: [{ status: 'duplicate', seq: 1 }] });
    await vi.waitFor(() => expect(heard.flatMap((m) => m.events.map((e) => e.seq))).toEqual([1, 2]), { timeout: 5_000, interval: 20 });
    expect(heard[0]).toMatchObject({ caseId, events: [{ id: first.id.toLowerCase(), caseId }, { payload: { targetId: first.id.toLowerCase() } }] });
    expect(await join(s, caseId.toUpperCase(), 1)).toMatchObject({ caseId, lastSeq: 2, events: [{ seq: 2 }] });
  });

  it('refuses a read after a sequence no case can reach, with the field named', async () => {
    const caseId = await newCase(t, team);
    const s = await tablet(url, team.cookies.nurse);
    expect(await raw(s, 'case.join', { caseId, afterSeq: 2 ** 31 })).toMatchObject({ code: 'bad_request', issues: [{ path: 'afterSeq' }] });
    expect(await join(s, caseId, 2 ** 31 - 1)).toMatchObject({ lastSeq: 0, events: [] });
    const res = await fetch(`${url}/api/cases/${caseId}/events?after=99999999999`, { headers: asBrowser(team.cookies.nurse) });
    expect(res.status).toBe(400);
    expect(await res.json()).toMatchObject({ issues: [{ path: 'after' }] });
  });
});
