import { and, asc, eq, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import type { Tx } from '#server/db/client.ts';
import { cases, patients, rooms, user } from '#server/db/schema/index.ts';
import type { CaseStatus } from '#shared/schemas/cases.ts';

const endoscopist = alias(user, 'endoscopist');
const nurse = alias(user, 'nurse');

/** Everything a case summary or detail shows, in one row. */
const caseColumns = {
  id: cases.id, unitId: cases.unitId, status: cases.status, procedureType: cases.procedureType,
  scheduledAt: cases.scheduledAt, indication: cases.indication, lesionSite: cases.lesionSite,
  lesionSizeMm: cases.lesionSizeMm, lesionParis: cases.lesionParis, sedation: cases.sedation,
  createdAt: cases.createdAt, closedAt: cases.closedAt, cancelledAt: cases.cancelledAt,
  cancelReason: cases.cancelReason, lastSeq: cases.lastSeq, createdBy: cases.createdBy,
  roomId: rooms.id, roomName: rooms.name, roomUnitId: rooms.unitId,
  patientId: patients.id, hospitalNumber: patients.hospitalNumber, familyName: patients.familyName,
  givenName: patients.givenName, birthDate: patients.birthDate, sex: patients.sex,
  endoscopistId: endoscopist.id, endoscopistName: endoscopist.name,
  nurseId: nurse.id, nurseName: nurse.name,
};

export type CaseRecord = Awaited<ReturnType<typeof selectCases>>[number];

function selectCases(db: Tx, where: SQL | undefined) {
  return db.select(caseColumns).from(cases)
    .innerJoin(rooms, eq(rooms.id, cases.roomId))
    .innerJoin(patients, eq(patients.id, cases.patientId))
    .innerJoin(endoscopist, eq(endoscopist.id, cases.endoscopistId))
    .innerJoin(nurse, eq(nurse.id, cases.nurseId))
    .where(where)
    .orderBy(asc(cases.scheduledAt), asc(cases.id));
}

/**
 * The unit's cases of one calendar day in the unit's time zone (today when no date is given), bounded
 * by the day's first and next day's first instant so the (unit, scheduled_at) index serves it.
 */
export function listCaseRecords(db: Tx, unitId: string, f: { date?: string; roomId?: string; status?: CaseStatus; timeZone: string }) {
  const day = f.date ? sql`${f.date}::date` : sql`(now() at time zone ${f.timeZone})::date`;
  return selectCases(db, and(
    eq(cases.unitId, unitId),
    sql`${cases.scheduledAt} >= (${day}::timestamp at time zone ${f.timeZone})`,
    sql`${cases.scheduledAt} < ((${day} + 1)::timestamp at time zone ${f.timeZone})`,
    f.roomId ? eq(cases.roomId, f.roomId) : undefined,
    f.status ? eq(cases.status, f.status) : undefined,
  ));
}

/** A case of this unit, or null (another unit's case is not found). */
export async function findCaseRecord(db: Tx, unitId: string, caseId: string) {
  const [row] = await selectCases(db, and(eq(cases.id, caseId), eq(cases.unitId, unitId))).limit(1);
  return row ?? null;
}

export type NewCaseRow = typeof cases.$inferInsert;

export async function insertCase(db: Tx, row: NewCaseRow): Promise<string> {
  const [created] = await db.insert(cases).values(row).returning({ id: cases.id });
  if (!created) throw new Error('insert into cases returned no row');
  return created.id;
}

/** Cancel the case if, and only if, it is still scheduled; the new row or null. */
export async function cancelScheduledCase(db: Tx, unitId: string, caseId: string, reason: string | null) {
  const [row] = await db.update(cases).set({ status: 'cancelled', cancelledAt: new Date(), cancelReason: reason })
    .where(and(eq(cases.id, caseId), eq(cases.unitId, unitId), eq(cases.status, 'scheduled')))
    .returning({ id: cases.id });
  return row ?? null;
}
