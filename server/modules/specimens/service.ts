import type { Db } from '#server/db/client.ts';
import type { SpecimenRow } from '#server/db/schema/index.ts';
import type { Auditor } from '#server/http/audit.ts';
import { conflict, notFound } from '#server/http/errors.ts';
import type { Actor } from '#server/http/session.ts';
import { ellipseAreaMm2 } from '#shared/domain/geometry.ts';
import { procedureTypeLabels, procedureTypeSchema } from '#shared/schemas/cases.ts';
import {
  handoffStatusSchema, retrievalMethodSchema, type createSpecimenSchema, type Specimen, type updateSpecimenSchema,
} from '#shared/schemas/specimens.ts';
import type { z } from 'zod';
import { specimenLabelPdf, barcodePng, type LabelSymbology } from '#server/services/labels.ts';
import { isUniqueViolation } from '#server/db/errors.ts';
import { assertOpen, caseOfUnit, openCaseOfUnit } from '../cases/access.ts';
import { findSpecimen, insertSpecimen, listSpecimens, retrievedAt, updateSpecimen, type SpecimenValues } from './queries.ts';

type CreateInput = z.output<typeof createSpecimenSchema>;
type UpdateInput = z.output<typeof updateSpecimenSchema>;

export function toSpecimen(r: SpecimenRow): Specimen {
  const area = r.longMm != null && r.shortMm != null ? ellipseAreaMm2(r.longMm, r.shortMm) : null;
  return {
    id: r.id, caseId: r.caseId, label: r.label,
    retrievalMethod: r.retrievalMethod ? retrievalMethodSchema.parse(r.retrievalMethod) : null,
    pieces: r.pieces, longMm: r.longMm, shortMm: r.shortMm, areaMm2: area,
    containerId: r.containerId, handoffStatus: handoffStatusSchema.parse(r.handoffStatus),
    createdAt: r.createdAt.toISOString(),
  };
}

/** Only the fields the request named: an absent field is left as it is, a null clears it. */
function valuesOf(input: UpdateInput): SpecimenValues {
  const out: SpecimenValues = {};
  for (const key of ['label', 'retrievalMethod', 'pieces', 'longMm', 'shortMm', 'containerId', 'handoffStatus'] as const) {
    if (input[key] !== undefined) (out as Record<string, unknown>)[key] = input[key];
  }
  return out;
}

export async function specimensOfCase(db: Db, actor: Actor, caseId: string, audit: Auditor): Promise<Specimen[]> {
  const c = await caseOfUnit(db, actor, caseId);
  await audit(db, { action: 'specimens.view', entityType: 'case', entityId: caseId, detail: { patientId: c.patientId } });
  return (await listSpecimens(db, caseId)).map(toSpecimen);
}

/** Add a specimen; a repeat of the same id in the same case answers the stored one (`created: false`). */
export async function addSpecimen(db: Db, actor: Actor, caseId: string, input: CreateInput, audit: Auditor): Promise<{ specimen: Specimen; created: boolean }> {
  const c = await caseOfUnit(db, actor, caseId);
  // A repeat is answered before the status is looked at: a tablet whose first answer was lost may send
  // again after the sign-out closed the record, and must hear that the specimen is stored.
  const repeat = async (id: string) => {
    const existing = await findSpecimen(db, id);
    if (existing && existing.caseId !== caseId) throw conflict('This specimen id belongs to another case', [{ path: 'id', message: 'Already used' }]);
    return existing ? { specimen: toSpecimen(existing), created: false } : null;
  };
  const earlier = input.id ? await repeat(input.id) : null;
  if (earlier) return earlier;
  assertOpen(c);
  const { id, ...rest } = input;
  return db.transaction(async (tx) => {
    const row = await insertSpecimen(tx, caseId, { ...(id ? { id } : {}), ...valuesOf(rest), label: rest.label });
    await audit(tx, { action: 'specimen.create', entityType: 'specimen', entityId: row.id, detail: { caseId, label: row.label } });
    return { specimen: toSpecimen(row), created: true };
  }).catch(async (err: unknown) => {
    // The same id sent twice at once: the one stored answers both.
    const raced = id && isUniqueViolation(err, 'specimens_pkey') ? await repeat(id) : null;
    if (raced) return raced;
    throw err;
  });
}

export async function changeSpecimen(db: Db, actor: Actor, caseId: string, specimenId: string, input: UpdateInput, audit: Auditor): Promise<Specimen> {
  await openCaseOfUnit(db, actor, caseId);
  const before = await findSpecimen(db, specimenId);
  if (!before || before.caseId !== caseId) throw notFound('No such specimen in this case');
  const values = valuesOf(input);
  const long = values.longMm !== undefined ? values.longMm : before.longMm;
  const short = values.shortMm !== undefined ? values.shortMm : before.shortMm;
  if (long != null && short != null && short > long) throw conflict('The short axis cannot be longer than the long axis', [{ path: 'shortMm', message: 'Longer than the long axis' }]);
  return db.transaction(async (tx) => {
    const row = (await updateSpecimen(tx, caseId, specimenId, values))!;
    await audit(tx, { action: 'specimen.update', entityType: 'specimen', entityId: specimenId, detail: { caseId, changed: values } });
    return toSpecimen(row);
  });
}

/** The container label (PNG barcode alone, or the printable PDF label); printing names the patient, so it is audited. */
export async function specimenLabel(db: Db, actor: Actor, caseId: string, specimenId: string, format: 'png' | 'pdf', symbology: LabelSymbology, audit: Auditor): Promise<Buffer> {
  const c = await caseOfUnit(db, actor, caseId);
  const s = await findSpecimen(db, specimenId);
  if (!s || s.caseId !== caseId) throw notFound('No such specimen in this case');
  await audit(db, { action: 'specimen.label', entityType: 'specimen', entityId: specimenId, detail: { caseId, format, symbology } });
  if (format === 'png') return barcodePng(s.id, symbology);
  const at = (await retrievedAt(db, caseId, specimenId)) ?? s.createdAt;
  return specimenLabelPdf({
    specimenId: s.id, label: s.label, containerId: s.containerId, collectedAt: at.toISOString(),
    patient: { familyName: c.familyName, givenName: c.givenName, hospitalNumber: c.hospitalNumber, birthDate: c.birthDate },
    procedure: procedureTypeLabels[procedureTypeSchema.parse(c.procedureType)],
  }, symbology);
}
