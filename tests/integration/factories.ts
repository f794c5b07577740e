import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { cases, patients, rooms, user } from '#server/db/schema/index.ts';
import type { Role } from '#shared/schemas/common.ts';
import type { ScheduleCaseInput } from '#shared/schemas/cases.ts';
import type { TestContext } from './helpers/app.ts';
import { ORIGIN } from './helpers/app.ts';

/** Test data is invented; every name carries a short random tag so tests never meet each other's rows. */
export const tag = () => randomUUID().slice(0, 8);

export const TEST_PASSWORD = 'correct-horse-battery';

export interface TestUser { id: string; email: string; name: string; password: string }
export interface TestMember extends TestUser { role: Role }
export interface TestUnit { id: string; name: string; hospital: string; admin: TestMember; rooms: { id: string; name: string }[] }

/** A user with a password, made through better-auth on the server (as the seed does). */
export async function buildUser(t: TestContext, over: Partial<Pick<TestUser, 'email' | 'name' | 'password'>> = {}): Promise<TestUser> {
  const k = tag();
  const email = over.email ?? `user-${k}@ledgerline.test`;
  const name = over.name ?? `Test User ${k}`;
  const password = over.password ?? TEST_PASSWORD;
  const { user: created } = await t.auth.api.signUpEmail({ body: { email, password, name } });
  return { id: created.id, email, name, password };
}

/** A unit (organization) with its admin and two rooms. */
export async function buildUnit(t: TestContext, over: { name?: string; hospital?: string; timeZone?: string } = {}): Promise<TestUnit> {
  const k = tag();
  const admin = await buildUser(t, { name: `Admin ${k}` });
  const name = over.name ?? `Test Unit ${k}`;
  const hospital = over.hospital ?? `Test Hospital ${k}`;
  const org = await t.auth.api.createOrganization({ body: { name, slug: `unit-${k}`, hospital, timeZone: over.timeZone ?? 'UTC', userId: admin.id } });
  const roomRows = await t.db.insert(rooms).values([{ unitId: org.id, name: 'Room 1' }, { unitId: org.id, name: 'Room 2' }]).returning({ id: rooms.id, name: rooms.name });
  return { id: org.id, name, hospital, admin: { ...admin, role: 'admin' }, rooms: roomRows };
}

/** A member of `unit` with `role`. */
export async function buildMember(t: TestContext, unit: Pick<TestUnit, 'id'>, role: Role, over: { name?: string } = {}): Promise<TestMember> {
  const u = await buildUser(t, { name: over.name ?? `Test ${role} ${tag()}` });
  await t.auth.api.addMember({ body: { userId: u.id, organizationId: unit.id, role } });
  return { ...u, role };
}

/** A unit with one member of every role (the admin is the unit's own). */
export async function buildTeam(t: TestContext) {
  const unit = await buildUnit(t);
  const [nurse, endoscopist, supervisor] = await Promise.all([
    buildMember(t, unit, 'nurse'), buildMember(t, unit, 'endoscopist'), buildMember(t, unit, 'supervisor'),
  ]);
  return { unit, members: { nurse, endoscopist, supervisor, admin: unit.admin } satisfies Record<Role, TestMember> };
}

/** The session cookie of a signed-in user (better-auth's server API, so no sign-in limit applies). */
export async function signIn(t: TestContext, u: Pick<TestUser, 'email' | 'password'>): Promise<string> {
  const { headers } = await t.auth.api.signInEmail({ body: { email: u.email, password: u.password }, returnHeaders: true });
  return headers.getSetCookie().map((c) => c.split(';', 1)[0]).join('; ');
}

/** Headers a browser on the app's origin would send with a session. */
export const asBrowser = (cookie?: string) => ({ origin: ORIGIN, ...(cookie ? { cookie } : {}) });

/** A valid schedule request for `unit` (override any part). */
export function scheduleInput(unit: TestUnit, team: { endoscopist: TestUser; nurse: TestUser }, over: Partial<ScheduleCaseInput> = {}): ScheduleCaseInput {
  const k = tag();
  return {
    patient: { hospitalNumber: `T-${k}`, familyName: `Family-${k}`, givenName: 'Test', birthDate: '1960-05-17', sex: 'female' },
    procedureType: 'esd',
    indication: 'Invented indication for a test',
    lesion: { site: 'gastric antrum', sizeMm: 30, paris: '0-IIa' },
    roomId: unit.rooms[0]!.id,
    scheduledAt: new Date().toISOString(),
    sedation: 'deep',
    endoscopistId: team.endoscopist.id,
    nurseId: team.nurse.id,
    ...over,
  };
}

/** A case row straight in the database (for tests that are not about scheduling). */
export async function buildCase(t: TestContext, unit: TestUnit, team: { endoscopist: TestUser; nurse: TestUser }, over: Partial<typeof cases.$inferInsert> = {}) {
  const k = tag();
  const [patient] = await t.db.insert(patients).values({ unitId: unit.id, hospitalNumber: `P-${k}`, familyName: `Patient-${k}`, givenName: 'Test', birthDate: '1955-01-02', sex: 'male' }).returning();
  const [row] = await t.db.insert(cases).values({
    unitId: unit.id, patientId: patient!.id, roomId: unit.rooms[0]!.id, procedureType: 'emr', indication: 'Invented',
    lesionSite: 'ascending colon', lesionSizeMm: 20, lesionParis: '0-IIa', sedation: 'moderate',
    endoscopistId: team.endoscopist.id, nurseId: team.nurse.id, scheduledAt: new Date(), ...over,
  }).returning();
  return row!;
}

export async function userByEmail(t: TestContext, email: string) {
  const [row] = await t.db.select().from(user).where(eq(user.email, email)).limit(1);
  return row ?? null;
}
