import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
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

describe('a server that stops', () => {
  it('drops the connections without telling the sockets to disconnect, so tablets reconnect by themselves', async () => {
    const other = await startNode(t);
    const s = await tablet(other.url, team.cookies.nurse);
    const closed = disconnected(s);
    await other.close();
    expect(await closed).toBe('transport close');
  });
});
