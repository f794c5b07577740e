import type { Tx } from '#server/db/client.ts';
import { conflict, notFound, type Issue } from '#server/http/errors.ts';
import type { Patient } from '#shared/schemas/api-patients.ts';
import { sexSchema, type PatientInput } from '#shared/schemas/cases.ts';
import { findPatientByHospitalNumber, insertPatientIfNew, type PatientRecord } from './queries.ts';

export const toPatient = (p: PatientRecord): Patient => ({ ...p, sex: sexSchema.parse(p.sex) });

const same = (a: string, b: string) => a.trim().localeCompare(b.trim(), undefined, { sensitivity: 'base' }) === 0;

/**
 * The unit's patient with this hospital number, made on first use. A hospital number already on file
 * must come with the same name, date of birth and sex: two identifiers that disagree are a wrong patient
 * or a typing slip, and the person scheduling must look, not the server guess (409 naming each field).
 */
export async function reuseOrCreatePatient(tx: Tx, unitId: string, input: PatientInput): Promise<Patient> {
  const created = await insertPatientIfNew(tx, unitId, input);
  if (created) return toPatient(created);
  const existing = await findPatientByHospitalNumber(tx, unitId, input.hospitalNumber);
  if (!existing) throw new Error(`patient ${input.hospitalNumber} neither inserted nor found`);
  const issues: Issue[] = [];
  const note = `differs from the unit's record for hospital number ${input.hospitalNumber}`;
  if (!same(existing.familyName, input.familyName)) issues.push({ path: 'patient.familyName', message: `Family name ${note}` });
  if (!same(existing.givenName, input.givenName)) issues.push({ path: 'patient.givenName', message: `Given name ${note}` });
  if (existing.birthDate !== input.birthDate) issues.push({ path: 'patient.birthDate', message: `Date of birth ${note}` });
  if (existing.sex !== input.sex) issues.push({ path: 'patient.sex', message: `Sex ${note}` });
  if (issues.length) throw conflict(`The patient details do not match hospital number ${input.hospitalNumber}`, issues);
  return toPatient(existing);
}

export async function findPatient(db: Tx, unitId: string, hospitalNumber: string): Promise<Patient> {
  const p = await findPatientByHospitalNumber(db, unitId, hospitalNumber);
  if (!p) throw notFound(`No patient with hospital number ${hospitalNumber} in this unit`);
  return toPatient(p);
}
