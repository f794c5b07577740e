import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { and, eq, sql } from 'drizzle-orm';
import { member, user } from '#server/db/schema/index.ts';
import { ORIGIN, createTestContext, type TestContext } from './helpers/app.ts';
import { asBrowser, buildMember, buildUnit, signIn, tag, type TestUnit } from './factories.ts';

let t: TestContext;
let unit: TestUnit;
let admin: string;

beforeAll(async () => {
  t = await createTestContext();
  unit = await buildUnit(t);
  admin = await signIn(t, unit.admin);
});
afterAll(() => t.close());

const invite = (email: string, role: string) => request(t.app).post('/api/invitations').set(asBrowser(admin)).send({ email, role });
const cookiesOf = (res: request.Response) => ([] as string[]).concat(res.headers['set-cookie'] ?? []).map((c) => c.split(';', 1)[0]).join('; ');
/** The one link in the newest mail to `to` that starts with `prefix`. */
const linkIn = (to: string, prefix: string) => {
  const [mail] = t.mail.messages(to);
  return mail?.links.find((l) => l.startsWith(prefix)) ?? null;
};

describe('inviting a person into the unit', () => {
  it('an admin invites by e-mail; the invitee gets a mail with the link to the accept page', async () => {
    const email = `nurse-${tag()}@ledgerline.test`;
    const res = await invite(email, 'nurse');
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ email, role: 'nurse', status: 'pending' });
    const [mail] = t.mail.messages(email);
    expect(mail?.subject).toBe(`Invitation to ${unit.name}, ${unit.hospital} on Ledgerline`);
    expect(mail?.text).toContain(`${unit.admin.name} has invited you to join ${unit.name}, ${unit.hospital} on Ledgerline as nurse.`);
    expect(linkIn(email, `${ORIGIN}/invite/`)).toBe(`${ORIGIN}/invite/${res.body.id}`);
  });

  it('the accept page reads the invitation without signing in', async () => {
    const email = `endo-${tag()}@ledgerline.test`;
    const { body: created } = await invite(email, 'endoscopist');
    const res = await request(t.app).get(`/api/invitations/${created.id}`);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ id: created.id, email, role: 'endoscopist', status: 'pending', expiresAt: created.expiresAt, unit: { id: unit.id, name: unit.name, hospital: unit.hospital } });
  });

  it('accepting makes the account, joins the unit with the invited role and signs the invitee in', async () => {
    const email = `super-${tag()}@ledgerline.test`;
    await invite(email, 'supervisor');
    const id = linkIn(email, `${ORIGIN}/invite/`)!.split('/').pop()!;
    const res = await request(t.app).post(`/api/invitations/${id}/accept`).set(asBrowser()).send({ name: 'Invented Reviewer', password: 'a-long-enough-secret' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ unit: { id: unit.id }, role: 'supervisor' });

    const me = await request(t.app).get('/api/me').set(asBrowser(cookiesOf(res)));
    expect(me.body).toMatchObject({ user: { email, name: 'Invented Reviewer' }, unit: { id: unit.id }, role: 'supervisor' });
    const [row] = await t.db.select().from(member).where(and(eq(member.organizationId, unit.id), eq(member.userId, res.body.userId)));
    expect(row?.role).toBe('supervisor');
    expect((await request(t.app).get(`/api/invitations/${id}`)).body.status).toBe('accepted');
  });

  it('removes the account it made when joining the unit fails, so the invitee can accept the same invitation again', async () => {
    const email = `nurse-${tag()}@ledgerline.test`;
    await invite(email, 'nurse');
    const id = linkIn(email, `${ORIGIN}/invite/`)!.split('/').pop()!;
    // A fault injected for this invitee only: the database refuses their membership row. (A function
    // body takes no parameters; the address is our own, made by tag().)
    const fn = sql.identifier(`refuse_member_${tag().toLowerCase().replace(/[^a-z0-9]/g, '')}`);
    await t.db.execute(sql`create function ${fn}() returns trigger language plpgsql as $$ begin
      if exists (select 1 from "user" where id = new.user_id and email = ${sql.raw(`'${email}'`)}) then raise exception 'injected fault'; end if;
      return new; end $$`);
    await t.db.execute(sql`create trigger ${fn} before insert on member for each row execute function ${fn}()`);
    const accept = () => request(t.app).post(`/api/invitations/${id}/accept`).set(asBrowser()).send({ name: 'Invented Nurse', password: 'a-long-enough-secret' });
    try {
      expect((await accept()).status).toBe(500);
    } finally {
      await t.db.execute(sql`drop trigger ${fn} on member`);
      await t.db.execute(sql`drop function ${fn}()`);
    }
    expect(await t.db.select().from(user).where(eq(user.email, email))).toEqual([]);
    expect((await request(t.app).get(`/api/invitations/${id}`)).body.status).toBe('pending');
    const again = await accept();
    expect(again.status).toBe(201);
    expect(again.body).toMatchObject({ unit: { id: unit.id }, role: 'nurse' });
  });

  it('a unit of 100 members takes one more (the auth library\'s default cap refused it only at the acceptance)', async () => {
    const big = await buildUnit(t);
    const k = tag();
    const fillers = await t.db.insert(user)
      .values(Array.from({ length: 99 }, (_, i) => ({ name: `Filler ${k}-${i}`, email: `filler-${k}-${i}@ledgerline.test` })))
      .returning({ id: user.id });
    await t.db.insert(member).values(fillers.map((u) => ({ organizationId: big.id, userId: u.id, role: 'nurse', createdAt: new Date() })));
    const email = `late-${k}@ledgerline.test`;
    const sent = await request(t.app).post('/api/invitations').set(asBrowser(await signIn(t, big.admin))).send({ email, role: 'nurse' });
    expect(sent.status).toBe(201);
    const id = linkIn(email, `${ORIGIN}/invite/`)!.split('/').pop()!;
    const res = await request(t.app).post(`/api/invitations/${id}/accept`).set(asBrowser()).send({ name: 'Late Joiner', password: 'a-long-enough-secret' });
    expect(res.status).toBe(201);
    expect(await t.db.select().from(member).where(eq(member.organizationId, big.id))).toHaveLength(101);
  });

  it('an invitation is accepted once only', async () => {
    const email = `once-${tag()}@ledgerline.test`;
    const { body: created } = await invite(email, 'nurse');
    const accept = () => request(t.app).post(`/api/invitations/${created.id}/accept`).set(asBrowser()).send({ name: 'Invented Nurse', password: 'a-long-enough-secret' });
    expect((await accept()).status).toBe(201);
    const again = await accept();
    expect(again.status).toBe(409);
    expect(again.body.error).toBe('This invitation is accepted; ask your unit administrator for a new one');
  });

  it('the invited e-mail may also sign up through better-auth and accept there', async () => {
    const email = `direct-${tag()}@ledgerline.test`;
    const { body: created } = await invite(email, 'endoscopist');
    const signUp = await request(t.app).post('/api/auth/sign-up/email').set(asBrowser()).send({ email, password: 'a-long-enough-secret', name: 'Invented Endoscopist' });
    expect(signUp.status).toBe(200);
    const accepted = await request(t.app).post('/api/auth/organization/accept-invitation').set(asBrowser(cookiesOf(signUp))).send({ invitationId: created.id });
    expect(accepted.status).toBe(200);
    const me = await request(t.app).get('/api/me').set(asBrowser(cookiesOf(signUp)));
    expect(me.body).toMatchObject({ unit: { id: unit.id }, role: 'endoscopist' });
  });

  it('open sign-up is refused for an e-mail with no pending invitation', async () => {
    const email = `stranger-${tag()}@ledgerline.test`;
    const res = await request(t.app).post('/api/auth/sign-up/email').set(asBrowser()).send({ email, password: 'a-long-enough-secret', name: 'Invented Stranger' });
    expect(res.status).toBe(403);
    expect(res.body.message).toBe('Sign-up is by invitation only; ask your unit administrator for an invitation');
  });

  it('an e-mail that is already a member cannot be invited again (409 naming the e-mail)', async () => {
    const existing = await buildMember(t, unit, 'nurse');
    const res = await invite(existing.email, 'endoscopist');
    expect(res.status).toBe(409);
    expect(res.body.issues[0].path).toBe('email');
  });

  it('a second invitation to the same e-mail replaces the first', async () => {
    const email = `twice-${tag()}@ledgerline.test`;
    const first = await invite(email, 'nurse');
    const second = await invite(email, 'endoscopist');
    expect(second.status).toBe(201);
    expect((await request(t.app).get(`/api/invitations/${first.body.id}`)).body.status).toBe('canceled');
    const list = await request(t.app).get('/api/invitations').set(asBrowser(admin));
    expect(list.body.filter((i: { email: string }) => i.email === email).map((i: { status: string }) => i.status)).toEqual(['pending', 'canceled']);
  });
});

describe('resetting a forgotten password', () => {
  it('mails a link to the app\'s reset page; the token sets a new password that signs in', async () => {
    const person = await buildMember(t, unit, 'nurse');
    const asked = await request(t.app).post('/api/auth/request-password-reset').set(asBrowser()).send({ email: person.email });
    expect(asked.status).toBe(200);
    const link = linkIn(person.email, `${ORIGIN}/reset-password?token=`);
    expect(link).not.toBeNull();
    const token = new URL(link!).searchParams.get('token')!;

    const reset = await request(t.app).post('/api/auth/reset-password').set(asBrowser()).send({ token, newPassword: 'a-brand-new-secret' });
    expect(reset.status).toBe(200);
    const oldOne = await request(t.app).post('/api/auth/sign-in/email').set(asBrowser()).send({ email: person.email, password: person.password });
    expect(oldOne.status).toBe(401);
    const newOne = await request(t.app).post('/api/auth/sign-in/email').set(asBrowser()).send({ email: person.email, password: 'a-brand-new-secret' });
    expect(newOne.status).toBe(200);
  });
});
