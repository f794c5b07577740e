import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createTestContext, type TestContext } from './helpers/app.ts';
import { asBrowser, buildTeam, scheduleInput, signIn, type TestMember, type TestUnit } from './factories.ts';

/** Bad requests answer 400 with `{ error, issues: [{ path, message }] }` naming the field, never 500. */
let t: TestContext;
let unit: TestUnit;
let team: Record<'nurse' | 'endoscopist' | 'admin', TestMember>;
let nurse: string;
let admin: string;

beforeAll(async () => {
  t = await createTestContext();
  const built = await buildTeam(t);
  unit = built.unit;
  team = built.members;
  [nurse, admin] = await Promise.all([signIn(t, team.nurse), signIn(t, team.admin)]);
});
afterAll(() => t.close());

const paths = (res: request.Response) => (res.body.issues ?? []).map((i: { path: string }) => i.path);

describe('POST /api/cases with a bad body', () => {
  const bad: [string, (x: ReturnType<typeof scheduleInput>) => unknown, string[]][] = [
    ['a missing hospital number', (x) => ({ ...x, patient: { ...x.patient, hospitalNumber: '' } }), ['patient.hospitalNumber']],
    ['a date of birth in the future', (x) => ({ ...x, patient: { ...x.patient, birthDate: '2999-01-01' } }), ['patient.birthDate']],
    ['a date of birth that is no date', (x) => ({ ...x, patient: { ...x.patient, birthDate: '17/05/1960' } }), ['patient.birthDate']],
    ['an unknown procedure type', (x) => ({ ...x, procedureType: 'polypectomy' }), ['procedureType']],
    ['a lesion size in fractions of a millimetre', (x) => ({ ...x, lesion: { ...x.lesion, sizeMm: 12.5 } }), ['lesion.sizeMm']],
    ['a lesion size given as text', (x) => ({ ...x, lesion: { ...x.lesion, sizeMm: '30' } }), ['lesion.sizeMm']],
    ['a Paris type that does not exist', (x) => ({ ...x, lesion: { ...x.lesion, paris: '0-IV' } }), ['lesion.paris']],
    ['a room id that is no UUID', (x) => ({ ...x, roomId: 'room-a' }), ['roomId']],
    ['a start time without an offset', (x) => ({ ...x, scheduledAt: '2031-05-06 09:30' }), ['scheduledAt']],
    ['an unknown sedation', (x) => ({ ...x, sedation: 'none' }), ['sedation']],
    ['no team at all', ({ endoscopistId: _e, nurseId: _n, ...x }) => x, ['endoscopistId', 'nurseId']],
    ['an endoscopist id that is no UUID', (x) => ({ ...x, endoscopistId: 'dr-osei' }), ['endoscopistId']],
    // ISO 8601 has a year 0000 (1 BC); PostgreSQL's calendar does not.
    ['a date of birth in year 0', (x) => ({ ...x, patient: { ...x.patient, birthDate: '0000-06-15' } }), ['patient.birthDate']],
    ['a start time in year 0', (x) => ({ ...x, scheduledAt: '0000-01-01T09:00:00Z' }), ['scheduledAt']],
    // Text PostgreSQL cannot store as sent: a NUL, and half of a UTF-16 surrogate pair (stored as U+FFFD before).
    ['a NUL character in the indication', (x) => ({ ...x, indication: 'Lateral \u0000 lesion' }), ['indication']],
    ['half a surrogate pair in the indication', (x) => ({ ...x, indication: 'Lateral \ud800 lesion' }), ['indication']],
  ];
  it.each(bad)('names the field for %s', async (_what, change, expected) => {
    const res = await request(t.app).post('/api/cases').set(asBrowser(nurse)).send(change(scheduleInput(unit, team)) as object);
    expect(res.status).toBe(400);
    expect(paths(res)).toEqual(expected);
    expect(res.body.error).toContain(expected[0]);
  });

  it('refuses a body that is not an object', async () => {
    const res = await request(t.app).post('/api/cases').set(asBrowser(nurse)).send([1, 2]);
    expect(res.status).toBe(400);
    expect(res.body.issues[0]).toEqual({ path: '', message: expect.any(String) });
  });

  it('refuses JSON that does not parse, with 400 and no stack', async () => {
    const res = await request(t.app).post('/api/cases').set(asBrowser(nurse)).set('content-type', 'application/json').send('{"patient": ');
    expect(res.status).toBe(400);
    expect(res.body).toEqual({ error: 'The request body is not valid JSON' });
  });

  it('refuses a body over the size limit with 413', async () => {
    const res = await request(t.app).post('/api/cases').set(asBrowser(nurse)).send({ indication: 'x'.repeat(1_100_000) });
    expect(res.status).toBe(413);
  });
});

describe('bad query strings and paths', () => {
  const bad: [string, string, string[]][] = [
    ['a day that is no date', '/api/cases?date=tomorrow', ['date']],
    ['a day that does not exist', '/api/cases?date=2031-02-30', ['date']],
    ['an unknown status', '/api/cases?status=done', ['status']],
    ['a room id that is no UUID', '/api/cases?roomId=A', ['roomId']],
    ['a repeated parameter', '/api/cases?status=scheduled&status=closed', ['status']],
    ['a case id that is no UUID', '/api/cases/42', ['id']],
    ['an unknown role', '/api/members?role=surgeon', ['role']],
    ['a missing hospital number', '/api/patients', ['hospitalNumber']],
    ['an audit page size too large', '/api/audit?limit=100000', ['limit']],
    ['an invitation id that is no UUID', '/api/invitations/abc', ['id']],
    ['a day in year 0', '/api/cases?date=0000-01-01', ['date']],
    ['a NUL character in a hospital number', '/api/patients?hospitalNumber=%00', ['hospitalNumber']],
  ];
  it.each(bad)('names the parameter for %s', async (_what, path, expected) => {
    const cookie = path.startsWith('/api/audit') ? admin : nurse;
    const res = await request(t.app).get(path).set(asBrowser(cookie));
    expect(res.status).toBe(400);
    expect(paths(res)).toEqual(expected);
  });

  it('answers an unknown API path with a JSON 404', async () => {
    const res = await request(t.app).get('/api/nothing-here').set(asBrowser(nurse));
    expect(res.status).toBe(404);
    expect(res.body).toEqual({ error: 'No route GET /api/nothing-here' });
  });

  it('answers a well-formed case id that does not exist with 404', async () => {
    const res = await request(t.app).get('/api/cases/00000000-0000-4000-8000-000000000000').set(asBrowser(nurse));
    expect(res.status).toBe(404);
  });
});

describe('bad bodies elsewhere', () => {
  it('POST /api/cases/:id/cancel names a reason that is too long', async () => {
    const created = await request(t.app).post('/api/cases').set(asBrowser(nurse)).send(scheduleInput(unit, team));
    const res = await request(t.app).post(`/api/cases/${created.body.id}/cancel`).set(asBrowser(nurse)).send({ reason: 'x'.repeat(501) });
    expect(res.status).toBe(400);
    expect(paths(res)).toEqual(['reason']);
  });

  it('POST /api/invitations names a bad e-mail and an unknown role', async () => {
    const res = await request(t.app).post('/api/invitations').set(asBrowser(admin)).send({ email: 'not-an-address', role: 'owner' });
    expect(res.status).toBe(400);
    expect(paths(res)).toEqual(['email', 'role']);
  });

  it('POST /api/invitations/:id/accept names a short password and a missing name', async () => {
    const inv = await request(t.app).post('/api/invitations').set(asBrowser(admin)).send({ email: `short-${Date.now()}@ledgerline.test`, role: 'nurse' });
    const res = await request(t.app).post(`/api/invitations/${inv.body.id}/accept`).set(asBrowser()).send({ password: 'short' });
    expect(res.status).toBe(400);
    expect(paths(res)).toEqual(['name', 'password']);
  });
});
