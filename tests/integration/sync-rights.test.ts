import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { Db } from '#server/db/client.ts';
import { checkRights } from '#server/realtime/rights.ts';
import type { RunningServer } from '#server/server.ts';
import { member } from '#server/db/schema/index.ts';
import { caseRoom } from '#shared/contracts/sync.ts';
import { signIn } from './factories.ts';
import { createTestContext, type TestContext } from './helpers/app.ts';
import { join, newCase, push, recordedBy, signedInTeam, startNode, stopAll, tablet, tap, type SignedInTeam, type TestSocket } from './sync-helpers.ts';

let t: TestContext;
let node: RunningServer;
let team: SignedInTeam;
beforeAll(async () => {
  t = await createTestContext();
  // The rights of open sockets checked every 100 ms (15 s by default), so a test waits for a moment only.
  node = await startNode(t, { RIGHTS_CHECK_MS: 100 });
  team = await signedInTeam(t);
});
afterAll(async () => {
  await stopAll();
  await t?.close();
});

const eventually = <T>(check: () => T) => vi.waitFor(check, { timeout: 5_000, interval: 20 });
const disconnected = (s: TestSocket) => new Promise<string>((resolve) => s.once('disconnect', (reason) => resolve(reason)));
const inRoom = (s: TestSocket, caseId: string) => !!node.io.of('/').adapter.rooms.get(caseRoom(caseId))?.has(s.id!);

describe('the rights of a socket that only listens', () => {
  it('closes a socket whose session was signed out elsewhere; the other tablets go on hearing the case', async () => {
    const caseId = await newCase(t, team);
    const ended = await signIn(t, team.members.nurse);
    const [s, other] = await Promise.all([tablet(node.url, ended), tablet(node.url, team.cookies.endoscopist)]);
    await Promise.all([join(s, caseId), join(other, caseId)]);
    const closed = disconnected(s);
    await t.auth.api.signOut({ headers: new Headers({ cookie: ended }) });
    // Told by the server: the tablet does not reconnect with the ended session by itself.
    expect(await closed).toBe('io server disconnect');
    const heard = recordedBy(other);
    const writer = await tablet(node.url, team.cookies.nurse);
    await push(writer, caseId, [tap('scope_in', caseId, team.members.nurse.id)]);
    await eventually(() => expect(heard).toHaveLength(1));
    expect(other.connected).toBe(true);
  });

  it('takes a socket out of the rooms of every case of a unit its user left, and keeps it in the rooms of its own unit', async () => {
    const caseId = await newCase(t, team);
    const alsoThere = await newCase(t, team);
    const removed = await signedInTeam(t);
    // The other team's supervisor also belonged to this unit, and is removed from it while listening.
    await t.auth.api.addMember({ body: { userId: removed.members.supervisor.id, organizationId: team.unit.id, role: 'supervisor' } });
    const ownCase = await newCase(t, removed);
    const s = await tablet(node.url, removed.cookies.supervisor);
    await Promise.all([join(s, caseId), join(s, alsoThere), join(s, ownCase)]);
    expect(inRoom(s, caseId)).toBe(true);
    await t.db.delete(member).where(and(eq(member.userId, removed.members.supervisor.id), eq(member.organizationId, team.unit.id)));
    await eventually(() => expect(inRoom(s, caseId)).toBe(false));
    expect(inRoom(s, alsoThere)).toBe(false);
    expect(inRoom(s, ownCase)).toBe(true);
    expect(s.connected).toBe(true);
    const heard = recordedBy(s);
    const writer = await tablet(node.url, team.cookies.nurse);
    await push(writer, caseId, [tap('scope_in', caseId, team.members.nurse.id)]);
    const ownWriter = await tablet(node.url, removed.cookies.nurse);
    await push(ownWriter, ownCase, [tap('scope_in', ownCase, removed.members.nurse.id)]);
    await eventually(() => expect(heard.map((m) => m.caseId)).toEqual([ownCase]));
    // And joining the case again is refused like any case of another unit.
    expect(await join(s, caseId)).toMatchObject({ code: 'not_found' });
  });
});

/**
 * `db` whose second query (checkRights' read of who may read which case) waits for `release` once it
 * is sent for, and says so through `reached`: what a socket does meanwhile happens during the check.
 */
function pausingSecondRead(db: Db) {
  let reads = 0;
  let release!: () => void;
  let reached!: () => void;
  const released = new Promise<void>((r) => { release = r; });
  const reachedP = new Promise<void>((r) => { reached = r; });
  const gated = <T extends object>(obj: T): T => new Proxy(obj, {
    get(target, prop) {
      const value = Reflect.get(target, prop, target) as unknown;
      if (prop === 'then' && typeof value === 'function') {
        return (ok: (v: unknown) => void, fail: (e: unknown) => void) => { reached(); return released.then(() => value.call(target, ok, fail)); };
      }
      if (typeof value !== 'function') return value;
      return (...args: unknown[]) => {
        const out = (value as (...a: unknown[]) => unknown).apply(target, args);
        return out && typeof out === 'object' ? gated(out) : out;
      };
    },
  });
  const paused = new Proxy(db, {
    get(target, prop) {
      if (prop !== 'select') return Reflect.get(target, prop, target) as unknown;
      return (...args: Parameters<Db['select']>) => (++reads === 2 ? gated(target.select(...args)) : target.select(...args));
    },
  });
  return { db: paused, reached: reachedP, release };
}

describe('the rights check racing a join', () => {
  it('leaves alone a room joined while it reads who may read which case', async () => {
    const quiet = await startNode(t, { RIGHTS_CHECK_MS: 3_600_000 }); // no round of its own in this test
    const [first, second] = [await newCase(t, team), await newCase(t, team)];
    const s = await tablet(quiet.url, team.cookies.supervisor);
    await join(s, first);
    const pause = pausingSecondRead(t.db);
    const check = checkRights([...quiet.io.of('/').sockets.values()], pause.db);
    await pause.reached;
    await join(s, second); // its own access check passes now
    pause.release();
    expect(await check).toEqual({ closed: 0, left: 0 });
    const rooms = quiet.io.of('/').adapter.rooms;
    expect([rooms.get(caseRoom(first))?.has(s.id!), rooms.get(caseRoom(second))?.has(s.id!)]).toEqual([true, true]);
  });
});

describe('a server that stops', () => {
  it('drops the connections without telling the sockets to disconnect, so tablets reconnect by themselves', async () => {
    const other = await startNode(t);
    const s = await tablet(other.url, team.cookies.nurse);
    const closed = disconnected(s);
    await other.close();
    expect(await closed).toBe('transport close');
  });
});
