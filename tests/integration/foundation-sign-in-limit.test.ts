import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createTestContext, type TestContext } from './helpers/app.ts';
import { asBrowser, buildMember, buildUnit, type TestMember } from './factories.ts';

let t: TestContext;
let nurse: TestMember;

beforeAll(async () => {
  // A small window for the test; the server's default is 10 failures per 15 minutes.
  t = await createTestContext({ signInLimit: { windowMs: 60_000, limit: 3 } });
  nurse = await buildMember(t, await buildUnit(t), 'nurse');
});
afterAll(() => t.close());

const signIn = (password: string) => request(t.app).post('/api/auth/sign-in/email').set(asBrowser()).send({ email: nurse.email, password });

describe('sign-in attempts are limited per client address', () => {
  it('counts only failures: right passwords first, then three wrong ones, then the fourth is refused with 429', async () => {
    for (let i = 0; i < 4; i++) expect((await signIn(nurse.password)).status).toBe(200);
    for (let i = 0; i < 3; i++) expect((await signIn('wrong-password-123')).status).toBe(401);
    const refused = await signIn('wrong-password-123');
    expect(refused.status).toBe(429);
    expect(refused.body).toEqual({ error: 'Too many failed sign-ins from this address; try again in 1 minute' });
    expect(refused.headers.ratelimit).toEqual(expect.any(String));
  });

  it('refuses even the right password while the address is held back', async () => {
    expect((await signIn(nurse.password)).status).toBe(429);
  });

  it('limits only the sign-in route: the rest of the API still answers', async () => {
    expect((await request(t.app).get('/api/me').set(asBrowser())).status).toBe(401);
  });
});
