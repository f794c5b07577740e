import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { eq } from 'drizzle-orm';
import type { Options } from 'express-rate-limit';
import { rateLimitHits } from '#server/db/schema/index.ts';
import { PostgresRateLimitStore } from '#server/http/rate-limit.ts';
import { createTestContext, type TestContext } from './helpers/app.ts';
import { migratedDatabase } from './helpers/db.ts';
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

describe('the count is kept in PostgreSQL, so that every node of the server shares it', () => {
  it('three failures spread over two nodes hold the address back on both', async () => {
    const limit = { windowMs: 60_000, limit: 3, prefix: `shared-${randomUUID()}:` };
    const a = await createTestContext({ signInLimit: limit });
    const b = await createTestContext({ signInLimit: limit, databaseUrl: await migratedDatabase() });
    try {
      const member = await buildMember(a, await buildUnit(a), 'nurse');
      const on = (node: TestContext, password: string) => request(node.app).post('/api/auth/sign-in/email').set(asBrowser()).send({ email: member.email, password });
      expect((await on(a, 'wrong-password-123')).status).toBe(401);
      expect((await on(b, 'wrong-password-123')).status).toBe(401);
      expect((await on(b, member.password)).status).toBe(200); // a success counts for nothing
      expect((await on(a, 'wrong-password-123')).status).toBe(401);
      expect((await on(b, member.password)).status).toBe(429);
      expect((await on(a, member.password)).status).toBe(429);
    } finally {
      await a.close();
      await b.close();
    }
  });
});

describe('the PostgreSQL counter', () => {
  it('counts hits in a window, takes one back, and starts again once the window has ended', async () => {
    const store = new PostgresRateLimitStore(t.db, `store-${randomUUID()}:`);
    store.init({ windowMs: 60_000 } as Options);
    expect((await store.increment('198.51.100.4')).totalHits).toBe(1);
    const second = await store.increment('198.51.100.4');
    expect(second.totalHits).toBe(2);
    expect(second.resetTime!.getTime()).toBeGreaterThan(Date.now() + 50_000);
    await store.decrement('198.51.100.4');
    expect((await store.increment('198.51.100.4')).totalHits).toBe(2);
    expect((await store.increment('198.51.100.5')).totalHits).toBe(1); // another address counts alone
    // The window ends: the next hit is the first of a new one.
    await t.db.update(rateLimitHits).set({ resetAt: new Date(Date.now() - 1000) }).where(eq(rateLimitHits.key, `${store.prefix}198.51.100.4`));
    expect((await store.increment('198.51.100.4')).totalHits).toBe(1);
    await store.resetKey('198.51.100.4');
    expect((await store.increment('198.51.100.4')).totalHits).toBe(1);
  });
});
