import type { CaseDetail } from '#shared/schemas/api-cases.ts';
import { caseStatusSchema, parisTypeSchema, procedureTypeSchema, sedationTypeSchema, sexSchema, type CaseSummary } from '#shared/schemas/cases.ts';
import type { CaseRecord } from './queries.ts';

/** A row as the API shows it. The words come from CHECK-constrained columns; parse keeps the types honest. */
export function toSummary(r: CaseRecord): CaseSummary {
  return {
    id: r.id, unitId: r.unitId,
    status: caseStatusSchema.parse(r.status),
    procedureType: procedureTypeSchema.parse(r.procedureType),
    scheduledAt: r.scheduledAt.toISOString(),
    room: { id: r.roomId, name: r.roomName, unitId: r.roomUnitId },
    patient: { id: r.patientId, hospitalNumber: r.hospitalNumber, familyName: r.familyName, givenName: r.givenName, birthDate: r.birthDate, sex: sexSchema.parse(r.sex) },
    indication: r.indication,
    lesion: { site: r.lesionSite, sizeMm: r.lesionSizeMm, paris: parisTypeSchema.parse(r.lesionParis) },
    sedation: sedationTypeSchema.parse(r.sedation),
    endoscopist: { id: r.endoscopistId, name: r.endoscopistName },
    nurse: { id: r.nurseId, name: r.nurseName },
  };
}

export function toDetail(r: CaseRecord): CaseDetail {
  return {
    ...toSummary(r),
    createdAt: r.createdAt.toISOString(),
    closedAt: r.closedAt?.toISOString() ?? null,
    cancelledAt: r.cancelledAt?.toISOString() ?? null,
    cancelReason: r.cancelReason,
    lastSeq: r.lastSeq,
  };
}
