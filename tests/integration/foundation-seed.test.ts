import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { asc, count, eq } from 'drizzle-orm';
import { catalogueItems, cases, events, member, organization, patients, rooms, user } from '#server/db/schema/index.ts';
import { seedDemo, type SeedResult } from '#server/db/seed/index.ts';
import { demoUsers } from '#server/db/seed/demo-data.ts';
import { gs1CheckDigit } from '#shared/domain/identifiers/index.ts';
import { createTestContext, type TestContext } from './helpers/app.ts';
import { freshDatabase } from './helpers/db.ts';
import { asBrowser, signIn } from './factories.ts';

// The seed runs only on an empty database, so this file has one of its own, dropped at the end.
let fresh: Awaited<ReturnType<typeof freshDatabase>>;
let t: TestContext;
let first: SeedResult;

beforeAll(async () => {
  fresh = await freshDatabase('seed');
  t = await createTestContext({ databaseUrl: fresh.url });
  first = await seedDemo({ db: t.db, auth: t.auth });
}, 120_000);
afterAll(async () => {
  await t.close();
  await fresh.drop();
});

describe('the demo seed', () => {
  it('makes Kestrel Bay Hospital\'s Endoscopy Unit (level 3) with rooms A, B and C', async () => {
    expect(first.seeded).toBe(true);
    const units = await t.db.select().from(organization);
    expect(units.map((u) => [u.name, u.hospital])).toEqual([['Endoscopy Unit (level 3)', 'Kestrel Bay Hospital']]);
    const roomNames = await t.db.select({ name: rooms.name }).from(rooms).orderBy(asc(rooms.name));
    expect(roomNames.map((r) => r.name)).toEqual(['Room A', 'Room B', 'Room C']);
  });

  it('gives every role at least one person, each able to sign in with the demo password', async () => {
    const roleRows = await t.db.select({ email: user.email, role: member.role }).from(member).innerJoin(user, eq(user.id, member.userId));
    expect(new Set(roleRows.map((r) => r.role))).toEqual(new Set(['nurse', 'endoscopist', 'supervisor', 'admin']));
    expect(roleRows).toHaveLength(demoUsers.length);
    for (const u of demoUsers) {
      const cookie = await signIn(t, u);
      const me = await request(t.app).get('/api/me').set(asBrowser(cookie));
      expect(me.body).toMatchObject({ user: { email: u.email, name: u.name }, role: u.role, unit: { hospital: 'Kestrel Bay Hospital' } });
    }
  });

  it('fills the device catalogue with GTINs whose check digits are valid (GS1 General Specifications §7.9.1)', async () => {
    const items = await t.db.select().from(catalogueItems);
    expect(items.length).toBeGreaterThanOrEqual(8);
    for (const { gtin } of items.filter((i) => i.gtin)) expect(gs1CheckDigit(gtin!.slice(0, 13))).toBe(Number(gtin!.at(13)));
    expect(items.map((i) => i.type)).toEqual(expect.arrayContaining(['clip', 'loop', 'over_the_scope_clip', 'injection_needle']));
  });

  it('schedules three past cases and three for today, which today\'s list shows', async () => {
    const [n] = await t.db.select({ n: count() }).from(cases);
    expect(n?.n).toBe(6);
    const [p] = await t.db.select({ n: count() }).from(patients);
    expect(p?.n).toBe(6);
    const nurse = demoUsers.find((u) => u.role === 'nurse')!;
    const today = await request(t.app).get('/api/cases').set(asBrowser(await signIn(t, nurse)));
    expect(today.body.map((c: { room: { name: string } }) => c.room.name)).toEqual(['Room A', 'Room B', 'Room C']);
  });

  it('gives each past case its timeline, numbered 1…n, and closes it', async () => {
    if (!first.seeded) throw new Error('not seeded');
    for (const kind of ['eftr', 'esd', 'emr']) {
      const caseId = first.caseIds[kind]!;
      const seqs = (await t.db.select({ seq: events.seq }).from(events).where(eq(events.caseId, caseId)).orderBy(asc(events.seq))).map((e) => e.seq);
      expect(seqs.length).toBeGreaterThan(0);
      expect(seqs).toEqual(seqs.map((_s, i) => i + 1));
      const [row] = await t.db.select().from(cases).where(eq(cases.id, caseId));
      expect(row).toMatchObject({ lastSeq: seqs.length, status: 'closed' });
    }
  });

  it('leaves a database that has a unit alone when run again', async () => {
    const second = await seedDemo({ db: t.db, auth: t.auth });
    expect(second).toEqual({ seeded: false });
    const [u] = await t.db.select({ n: count() }).from(user);
    expect(u?.n).toBe(demoUsers.length);
  });
});
