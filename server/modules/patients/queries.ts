import { and, eq } from 'drizzle-orm';
import type { Tx } from '#server/db/client.ts';
import { patients } from '#server/db/schema/index.ts';
import type { PatientInput } from '#shared/schemas/cases.ts';

const columns = {
  id: patients.id, hospitalNumber: patients.hospitalNumber, familyName: patients.familyName,
  givenName: patients.givenName, birthDate: patients.birthDate, sex: patients.sex,
};

export async function findPatientByHospitalNumber(db: Tx, unitId: string, hospitalNumber: string) {
  const [row] = await db.select(columns).from(patients)
    .where(and(eq(patients.unitId, unitId), eq(patients.hospitalNumber, hospitalNumber))).limit(1);
  return row ?? null;
}

/** Insert the patient unless the unit has that hospital number already; null when it had. */
export async function insertPatientIfNew(db: Tx, unitId: string, p: PatientInput) {
  const [row] = await db.insert(patients).values({ unitId, ...p })
    .onConflictDoNothing({ target: [patients.unitId, patients.hospitalNumber] }).returning(columns);
  return row ?? null;
}

export type PatientRecord = NonNullable<Awaited<ReturnType<typeof findPatientByHospitalNumber>>>;
