// `npm run db:seed`: fill an empty database with the invented demo unit. A database that has any unit
// already is left alone (never over real data), silently, so `npm start` can run it every time.
import { fileURLToPath } from 'node:url';
import pino from 'pino';
import { count, eq, sql } from 'drizzle-orm';
import type { Auth } from '../../auth.ts';
import { createAuth } from '../../auth.ts';
import { loadConfig } from '../../config.ts';
import { createMailer } from '../../services/mail.ts';
import { createDatabase, type Db } from '../client.ts';
import { catalogueItems, cases, organization, patients, rooms, user } from '../schema/index.ts';
import { demoCases, demoCatalogue, demoPatients, demoUnit, demoUsers, type DemoCase } from './demo-data.ts';
import { insertDemoTimelines } from './events.ts';

export type SeedResult = { seeded: false } | { seeded: true; unitId: string; caseIds: Record<string, string> };

/** The demo users' ids, made through better-auth (hashed passwords, accounts); existing ones are reused. */
async function ensureUsers(db: Db, auth: Auth): Promise<Map<string, string>> {
  const ids = new Map<string, string>();
  for (const u of demoUsers) {
    const [found] = await db.select({ id: user.id }).from(user).where(eq(sql`lower(${user.email})`, u.email)).limit(1);
    const id = found?.id ?? (await auth.api.signUpEmail({ body: { email: u.email, password: u.password, name: u.name } })).user.id;
    await db.update(user).set({ emailVerified: true }).where(eq(user.id, id));
    ids.set(u.email, id);
  }
  return ids;
}

/** `daysAgo` days before today at local `time` (the unit's calendar is the server's zone). */
function localDateTime(daysAgo: number, time: string): Date {
  const [h, m] = time.split(':').map(Number) as [number, number];
  const d = new Date();
  d.setDate(d.getDate() - daysAgo);
  d.setHours(h, m, 0, 0);
  return d;
}

export async function seedDemo({ db, auth }: { db: Db; auth: Auth }): Promise<SeedResult> {
  const [units] = await db.select({ n: count() }).from(organization);
  if ((units?.n ?? 0) > 0) return { seeded: false };

  const userIds = await ensureUsers(db, auth);
  const idOf = (email: string) => {
    const id = userIds.get(email);
    if (!id) throw new Error(`demo user ${email} is not in demo-users.json`);
    return id;
  };
  const admin = demoUsers.find((u) => u.role === 'admin');
  if (!admin) throw new Error('demo-users.json has no admin');
  const timeZone = Intl.DateTimeFormat().resolvedOptions().timeZone;
  const unit = await auth.api.createOrganization({ body: { name: demoUnit.name, slug: demoUnit.slug, hospital: demoUnit.hospital, timeZone, userId: idOf(admin.email) } });
  for (const u of demoUsers.filter((x) => x !== admin)) {
    await auth.api.addMember({ body: { userId: idOf(u.email), organizationId: unit.id, role: u.role } });
  }

  return db.transaction(async (tx) => {
    const roomRows = await tx.insert(rooms).values(demoUnit.rooms.map((name) => ({ unitId: unit.id, name }))).returning();
    const items = await tx.insert(catalogueItems).values(demoCatalogue.map(({ key: _key, ...item }) => ({ unitId: unit.id, ...item }))).returning();
    const itemId = (key: 'clip' | 'loop' | 'otsc' | 'needle') => items[demoCatalogue.findIndex((c) => c.key === key)]!.id;
    const patientRows = await tx.insert(patients).values(demoPatients.map((p) => ({ unitId: unit.id, ...p }))).returning();

    const caseIds: Record<string, string> = {};
    const insertCase = async (c: DemoCase) => {
      const [row] = await tx.insert(cases).values({
        unitId: unit.id,
        patientId: patientRows.find((p) => p.hospitalNumber === c.patient)!.id,
        roomId: roomRows.find((r) => r.name === c.room)!.id,
        procedureType: c.procedureType, indication: c.indication, sedation: c.sedation,
        lesionSite: c.lesion.site, lesionSizeMm: c.lesion.sizeMm, lesionParis: c.lesion.paris,
        endoscopistId: idOf(c.endoscopist), nurseId: idOf(c.nurse),
        scheduledAt: localDateTime(c.daysAgo, c.time), createdBy: idOf(c.nurse),
        createdAt: localDateTime(c.daysAgo + 2, '15:00'),
      }).returning({ id: cases.id });
      return row!.id;
    };
    for (const c of demoCases) caseIds[c.timeline ?? `today-${c.room}`] = await insertCase(c);

    await insertDemoTimelines(tx, demoCases.filter((c) => c.timeline).map((c) => ({
      timeline: c.timeline!, caseId: caseIds[c.timeline!]!, startAt: localDateTime(c.daysAgo, c.time),
      nurseId: idOf(c.nurse), endoscopistId: idOf(c.endoscopist),
    })), { clip: itemId('clip'), loop: itemId('loop'), otsc: itemId('otsc'), needle: itemId('needle') });
    return { seeded: true as const, unitId: unit.id, caseIds };
  });
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const config = loadConfig();
  const database = createDatabase(config.DATABASE_URL, { max: 2 });
  const auth = createAuth({ db: database.db, config, mailer: createMailer(config), logger: pino({ level: config.LOG_LEVEL }) });
  seedDemo({ db: database.db, auth })
    .then((r) => { if (r.seeded) console.log(`Seeded the demo unit "${demoUnit.name}, ${demoUnit.hospital}" (${demoUsers.length} users, ${demoCases.length} cases)`); })
    .catch((error: unknown) => { console.error(error); process.exitCode = 1; })
    .finally(() => database.close());
}
