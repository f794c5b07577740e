import { and, desc, eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadConfig } from '#server/config.ts';
import { auditLog, session } from '#server/db/schema/index.ts';
import { CLIENT_ADDRESS_HEADER } from '#server/http/client-address.ts';
import { asBrowser, buildMember, buildUnit, type TestMember } from './factories.ts';
import { createTestContext, type TestContext } from './helpers/app.ts';
import { join, newCase, signedInTeam, startNode, stopAll, tablet } from './sync-helpers.ts';

// X-Forwarded-For (RFC 7239 describes the standard Forwarded header; this is its common older form):
// each proxy appends the address it received the request from, so the client is the rightmost address not
// added by a believed proxy. The values here are documentation addresses (RFC 5737).

/** A sign-in through the app, with these headers besides the browser's. */
const signInWith = (t: TestContext, headers: Record<string, string>, user: Pick<TestMember, 'email' | 'password'>) =>
  request(t.app).post('/api/auth/sign-in/email').set({ ...asBrowser(), ...headers }).send({ email: user.email, password: user.password });

/** The address better-auth wrote on the user's newest session. */
async function newestSessionAddress(t: TestContext, userId: string): Promise<string | null> {
  const [row] = await t.db.select({ ip: session.ipAddress }).from(session).where(eq(session.userId, userId)).orderBy(desc(session.createdAt)).limit(1);
  return row?.ip ?? null;
}

describe('without TRUST_PROXY', () => {
  let t: TestContext;
  let nurse: TestMember;
  beforeAll(async () => {
    t = await createTestContext({ signInLimit: { windowMs: 60_000, limit: 2 } });
    nurse = await buildMember(t, await buildUnit(t), 'nurse');
  });
  afterAll(() => t?.close());

  it('records a new session with the connection\'s address, not the first address a client wrote', async () => {
    const other = await buildMember(t, await buildUnit(t), 'nurse');
    expect((await signInWith(t, { 'x-forwarded-for': '192.0.2.77', [CLIENT_ADDRESS_HEADER]: '192.0.2.78' }, other)).status).toBe(200);
    expect(await newestSessionAddress(t, other.id)).toMatch(/127\.0\.0\.1$/);
  });

  it('counts failed sign-ins by the connection\'s address, whatever X-Forwarded-For a client claims', async () => {
    const attempt = (claimed: string) => signInWith(t, { 'x-forwarded-for': claimed }, { email: nurse.email, password: 'wrong-password-123' });
    expect((await attempt('192.0.2.1')).status).toBe(401);
    expect((await attempt('192.0.2.2')).status).toBe(401);
    expect((await attempt('192.0.2.3')).status).toBe(429);
  });
});

describe('with TRUST_PROXY naming the proxy', () => {
  let t: TestContext;
  let nurse: TestMember;
  beforeAll(async () => {
    // The test's requests come from 127.0.0.1: as if through a proxy on this host.
    t = await createTestContext({ signInLimit: { windowMs: 60_000, limit: 2 }, env: { TRUST_PROXY: 'loopback' } });
    nurse = await buildMember(t, await buildUnit(t), 'nurse');
  });
  afterAll(async () => {
    await stopAll();
    await t?.close();
  });

  it('records a new session with the client\'s address behind the proxy', async () => {
    const other = await buildMember(t, await buildUnit(t), 'nurse');
    expect((await signInWith(t, { 'x-forwarded-for': '198.51.100.1, 203.0.113.20' }, other)).status).toBe(200);
    expect(await newestSessionAddress(t, other.id)).toBe('203.0.113.20');
  });

  it('counts failed sign-ins per client behind the proxy: one nurse\'s mistakes do not lock out the others', async () => {
    const attempt = (client: string) => signInWith(t, { 'x-forwarded-for': client }, { email: nurse.email, password: 'wrong-password-123' });
    expect((await attempt('192.0.2.10')).status).toBe(401);
    expect((await attempt('192.0.2.10')).status).toBe(401);
    expect((await attempt('192.0.2.10')).status).toBe(429);
    expect((await attempt('198.51.100.7')).status).toBe(401);
  });

  it('writes the client\'s address behind the proxy to the audit log, from HTTP and from the sync socket', async () => {
    const team = await signedInTeam(t);
    const caseId = await newCase(t, team);
    const res = await request(t.app).get(`/api/cases/${caseId}/events`).set({ ...asBrowser(team.cookies.supervisor), 'x-forwarded-for': '203.0.113.5, 192.0.2.44' });
    expect(res.status).toBe(200);
    const node = await startNode(t);
    const s = await tablet(node.url, team.cookies.nurse, { 'x-forwarded-for': '203.0.113.9' });
    await join(s, caseId);
    const rows = await t.db.select({ userId: auditLog.userId, ip: auditLog.ip }).from(auditLog)
      .where(and(eq(auditLog.entityId, caseId), eq(auditLog.action, 'record.view')));
    // The rightmost address is the one the proxy (loopback, believed) received the request from.
    expect(rows).toEqual(expect.arrayContaining([
      { userId: team.members.supervisor.id, ip: '192.0.2.44' },
      { userId: team.members.nurse.id, ip: '203.0.113.9' },
    ]));
  });
});

describe('the TRUST_PROXY setting', () => {
  it('refuses to believe every hop, and a list that is not addresses, at start', () => {
    expect(() => loadConfig({ TRUST_PROXY: 'true' })).toThrow(/TRUST_PROXY: TRUST_PROXY=true would believe any client/);
    expect(() => loadConfig({ TRUST_PROXY: 'my-proxy.example' })).toThrow(/TRUST_PROXY: /);
    expect(loadConfig({ TRUST_PROXY: '2' }).TRUST_PROXY).toBe('2');
  });
});
