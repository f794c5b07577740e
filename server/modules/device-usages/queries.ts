import { and, asc, eq } from 'drizzle-orm';
import type { Tx } from '#server/db/client.ts';
import { deviceUsages, events } from '#server/db/schema/index.ts';

export type NewUsageRow = typeof deviceUsages.$inferInsert;

export async function listUsages(db: Tx, caseId: string) {
  return db.select().from(deviceUsages).where(eq(deviceUsages.caseId, caseId)).orderBy(asc(deviceUsages.createdAt), asc(deviceUsages.id));
}

export async function findUsage(db: Tx, usageId: string) {
  const [row] = await db.select().from(deviceUsages).where(eq(deviceUsages.id, usageId)).limit(1);
  return row ?? null;
}

export async function insertUsage(db: Tx, row: NewUsageRow) {
  const [created] = await db.insert(deviceUsages).values(row).returning();
  return created!;
}

/** The stored event of this case with this id (its kind tells whether a device can belong to it). */
export async function findCaseEvent(db: Tx, caseId: string, eventId: string) {
  const [row] = await db.select({ id: events.id, kind: events.kind }).from(events)
    .where(and(eq(events.id, eventId), eq(events.caseId, caseId))).limit(1);
  return row ?? null;
}
