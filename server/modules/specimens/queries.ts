import { and, asc, eq, sql } from 'drizzle-orm';
import type { Tx } from '#server/db/client.ts';
import { events, specimens, type SpecimenRow } from '#server/db/schema/index.ts';

export type SpecimenValues = Partial<Pick<SpecimenRow, 'label' | 'retrievalMethod' | 'pieces' | 'longMm' | 'shortMm' | 'containerId' | 'handoffStatus'>>;

export async function listSpecimens(db: Tx, caseId: string) {
  return db.select().from(specimens).where(eq(specimens.caseId, caseId)).orderBy(asc(specimens.createdAt), asc(specimens.label));
}

/** A specimen by id, whatever its case (the caller checks the case). */
export async function findSpecimen(db: Tx, specimenId: string) {
  const [row] = await db.select().from(specimens).where(eq(specimens.id, specimenId)).limit(1);
  return row ?? null;
}

export async function insertSpecimen(db: Tx, caseId: string, values: SpecimenValues & { id?: string; label: string }) {
  const [row] = await db.insert(specimens).values({ caseId, ...values }).returning();
  return row!;
}

export async function updateSpecimen(db: Tx, caseId: string, specimenId: string, values: SpecimenValues) {
  const [row] = await db.update(specimens).set(values)
    .where(and(eq(specimens.id, specimenId), eq(specimens.caseId, caseId))).returning();
  return row ?? null;
}

/** When the specimen came out: the earliest `specimen_retrieved` event that names it, as corrected time. */
export async function retrievedAt(db: Tx, caseId: string, specimenId: string): Promise<Date | null> {
  const [row] = await db.select({
    at: sql<string | null>`min(${events.deviceTime} + make_interval(secs => ${events.offsetMs} / 1000.0))`,
  }).from(events)
    .where(and(eq(events.caseId, caseId), eq(events.kind, 'specimen_retrieved'), sql`${events.payload}->>'specimenId' = ${specimenId}`));
  return row?.at ? new Date(row.at) : null;
}
