import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MAX_PUSH_BYTES } from '#shared/contracts/sync.ts';
import { createTestContext, type TestContext } from './helpers/app.ts';
import { join, newCase, push, signedInTeam, startNode, stopAll, tablet, tap, type SignedInTeam } from './sync-helpers.ts';

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
