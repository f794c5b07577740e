import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { roles, type Role } from '#shared/schemas/common.ts';
import { createTestContext, type TestContext } from './helpers/app.ts';
import { asBrowser, buildCase, buildTeam, scheduleInput, signIn, tag, type TestMember, type TestUnit } from './factories.ts';

/**
 * Every route of the server foundation, tried as each role of the unit, signed out, and as each role of
 * another unit. Who may do what is PRODUCT.md's Roles table, written out per route here (not read from
 * shared/domain/permissions.ts, so the test checks the code against the brief).
 */
type Unit = { unit: TestUnit; members: Record<Role, TestMember>; cookies: Record<Role, string> };
let t: TestContext;
let a: Unit;
let b: Unit;

async function buildSignedInTeam(): Promise<Unit> {
  const { unit, members } = await buildTeam(t);
  const cookies = Object.fromEntries(await Promise.all(roles.map(async (r) => [r, await signIn(t, members[r])] as const))) as Record<Role, string>;
  return { unit, members, cookies };
}

beforeAll(async () => {
  t = await createTestContext();
  [a, b] = await Promise.all([buildSignedInTeam(), buildSignedInTeam()]);
});
afterAll(() => t.close());

type Call = { method: 'get' | 'post'; path: string; body?: object };
type RouteCase = {
  route: string;
  /** Roles allowed, from PRODUCT.md's Roles table; `public` needs no session. */
  allowed: readonly Role[] | 'public';
  ok: number;
  /** A fresh call (routes that change things get fresh targets each time). */
  call(u: Unit): Promise<Call>;
};

const everyone = roles;
const recorders = ['nurse', 'endoscopist'] as const;
const caseOf = async (u: Unit) => (await buildCase(t, u.unit, u.members)).id;

const routes: RouteCase[] = [
  { route: 'GET /api/me', allowed: everyone, ok: 200, call: async () => ({ method: 'get', path: '/api/me' }) },
  { route: 'GET /api/rooms', allowed: everyone, ok: 200, call: async () => ({ method: 'get', path: '/api/rooms' }) },
  { route: 'GET /api/members', allowed: everyone, ok: 200, call: async () => ({ method: 'get', path: '/api/members?role=nurse' }) },
  { route: 'GET /api/cases', allowed: everyone, ok: 200, call: async () => ({ method: 'get', path: '/api/cases' }) },
  { route: 'GET /api/cases/:id', allowed: everyone, ok: 200, call: async (u) => ({ method: 'get', path: `/api/cases/${await caseOf(u)}` }) },
  { route: 'POST /api/cases', allowed: recorders, ok: 201, call: async (u) => ({ method: 'post', path: '/api/cases', body: scheduleInput(u.unit, u.members) }) },
  { route: 'POST /api/cases/:id/cancel', allowed: recorders, ok: 200, call: async (u) => ({ method: 'post', path: `/api/cases/${await caseOf(u)}/cancel`, body: {} }) },
  { route: 'GET /api/patients', allowed: recorders, ok: 200, call: async (u) => {
    const c = await buildCase(t, u.unit, u.members);
    const { patients } = await import('#server/db/schema/index.ts');
    const { eq } = await import('drizzle-orm');
    const [p] = await t.db.select().from(patients).where(eq(patients.id, c.patientId));
    return { method: 'get', path: `/api/patients?hospitalNumber=${p!.hospitalNumber}` };
  } },
  { route: 'POST /api/invitations', allowed: ['admin'], ok: 201, call: async () => ({ method: 'post', path: '/api/invitations', body: { email: `invitee-${tag()}@ledgerline.test`, role: 'nurse' } }) },
  { route: 'GET /api/invitations', allowed: ['admin'], ok: 200, call: async () => ({ method: 'get', path: '/api/invitations' }) },
  { route: 'GET /api/invitations/:id', allowed: 'public', ok: 200, call: async (u) => {
    const inv = await request(t.app).post('/api/invitations').set(asBrowser(u.cookies.admin)).send({ email: `invitee-${tag()}@ledgerline.test`, role: 'endoscopist' });
    return { method: 'get', path: `/api/invitations/${inv.body.id}` };
  } },
  { route: 'GET /api/audit', allowed: ['supervisor', 'admin'], ok: 200, call: async () => ({ method: 'get', path: '/api/audit' }) },
];

const send = (c: Call, cookie?: string) => {
  const r = request(t.app)[c.method](c.path).set(asBrowser(cookie));
  return c.body ? r.send(c.body) : r;
};

describe.each(routes)('$route', ({ allowed, ok, call }) => {
  it.each(roles.map((role) => [role]))('as %s of the unit', async (role) => {
    const res = await send(await call(a), a.cookies[role]);
    const may = allowed === 'public' || allowed.includes(role);
    expect(res.status, JSON.stringify(res.body)).toBe(may ? ok : 403);
    if (!may) expect(res.body.error).toMatch(new RegExp(`^A ${role} may not do this`));
  });

  it('signed out', async () => {
    const res = await send(await call(a));
    expect(res.status).toBe(allowed === 'public' ? ok : 401);
  });
});

describe('a member of another unit', () => {
  it('gets 404 for this unit\'s case, as if there were none (ids reveal nothing across units)', async () => {
    const id = await caseOf(a);
    for (const role of roles) {
      const res = await send({ method: 'get', path: `/api/cases/${id}` }, b.cookies[role]);
      expect(res.status, role).toBe(404);
      expect(res.body).toEqual({ error: 'No such case in your unit' });
    }
  });

  it('cannot cancel this unit\'s case: 404 for the roles that may cancel, 403 for the others', async () => {
    for (const role of roles) {
      const res = await send({ method: 'post', path: `/api/cases/${await caseOf(a)}/cancel`, body: {} }, b.cookies[role]);
      expect(res.status, role).toBe(role === 'nurse' || role === 'endoscopist' ? 404 : 403);
    }
  });

  it('sees only their own unit in every list', async () => {
    const aCase = await buildCase(t, a.unit, a.members);
    const bCase = await buildCase(t, b.unit, b.members);
    const cookie = b.cookies.nurse;
    const cases = await send({ method: 'get', path: '/api/cases' }, cookie);
    expect(cases.body.map((c: { id: string }) => c.id)).toContain(bCase.id);
    expect(cases.body.map((c: { id: string }) => c.id)).not.toContain(aCase.id);
    const rooms = await send({ method: 'get', path: '/api/rooms' }, cookie);
    expect(rooms.body.map((r: { id: string }) => r.id).sort()).toEqual(b.unit.rooms.map((r) => r.id).sort());
    const members = await send({ method: 'get', path: '/api/members' }, cookie);
    expect(members.body.map((m: { userId: string }) => m.userId).sort()).toEqual(roles.map((r) => b.members[r].id).sort());
    const audit = await send({ method: 'get', path: '/api/audit' }, b.cookies.admin);
    const me = await send({ method: 'get', path: '/api/me' }, cookie);
    expect(me.body.unit.id).toBe(b.unit.id);
    expect(audit.body.entries.every((e: { user: { id: string } | null }) => e.user === null || roles.some((r) => b.members[r].id === e.user!.id))).toBe(true);
  });

  it('cannot schedule into this unit\'s room or with its team (400 naming each field)', async () => {
    const res = await send({ method: 'post', path: '/api/cases', body: scheduleInput(a.unit, a.members) }, b.cookies.nurse);
    expect(res.status).toBe(400);
    expect(res.body.issues.map((i: { path: string }) => i.path)).toEqual(['roomId', 'endoscopistId', 'nurseId']);
  });

  it('cannot look up this unit\'s patient', async () => {
    const input = scheduleInput(a.unit, a.members);
    await send({ method: 'post', path: '/api/cases', body: input }, a.cookies.nurse);
    const res = await send({ method: 'get', path: `/api/patients?hospitalNumber=${input.patient.hospitalNumber}` }, b.cookies.nurse);
    expect(res.status).toBe(404);
  });
});

describe('GET /api/me', () => {
  it('names the user, their unit with its hospital, and their role', async () => {
    const res = await send({ method: 'get', path: '/api/me' }, a.cookies.supervisor);
    expect(res.body).toEqual({
      user: { id: a.members.supervisor.id, name: a.members.supervisor.name, email: a.members.supervisor.email },
      unit: { id: a.unit.id, name: a.unit.name, hospital: a.unit.hospital },
      role: 'supervisor',
    });
  });

  it('answers 401 for a made-up session cookie', async () => {
    const res = await send({ method: 'get', path: '/api/me' }, 'better-auth.session_token=forged.value');
    expect(res.status).toBe(401);
    expect(res.body).toEqual({ error: 'Sign in first' });
  });
});
