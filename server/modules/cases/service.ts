import type { Db } from '#server/db/client.ts';
import { isUniqueViolation } from '#server/db/errors.ts';
import type { Auditor } from '#server/http/audit.ts';
import { badRequest, conflict, type Issue } from '#server/http/errors.ts';
import type { Actor } from '#server/http/session.ts';
import type { CancelCaseInput, CaseDetail } from '#shared/schemas/api-cases.ts';
import type { CaseStatus, CaseSummary, ScheduleCaseInput } from '#shared/schemas/cases.ts';
import { uuidSchema } from '#shared/schemas/common.ts';
import { hasRole } from '../members/queries.ts';
import { reuseOrCreatePatient } from '../patients/service.ts';
import { findRoom } from '../rooms/queries.ts';
import { toDetail, toSummary } from './mapping.ts';
import { caseOfUnit } from './access.ts';
import { cancelScheduledCase, findCaseRecord, insertCase, listCaseRecords, type CaseRecord } from './queries.ts';

/**
 * One day's cases of the unit. The list names patients (name, date of birth, hospital number), so a list
 * that shows any is a view of their records: written to the audit log with the cases and patients shown.
 */
export async function listCases(db: Db, actor: Actor, q: { date?: string; roomId?: string; status?: CaseStatus }, audit: Auditor): Promise<CaseSummary[]> {
  const date = q.date ?? new Intl.DateTimeFormat('en-CA', { timeZone: actor.timeZone }).format(new Date());
  const rows = await listCaseRecords(db, actor.unitId, { ...q, date, timeZone: actor.timeZone });
  if (rows.length) {
    await audit(db, {
      action: 'cases.list', entityType: 'unit', entityId: actor.unitId,
      detail: { date, roomId: q.roomId ?? null, status: q.status ?? null, caseIds: rows.map((r) => r.id), patientIds: [...new Set(rows.map((r) => r.patientId))] },
    });
  }
  return rows.map(toSummary);
}

/** The room and the team must be this unit's, each member in the role the field names. */
async function checkTeamAndRoom(db: Db, unitId: string, input: ScheduleCaseInput): Promise<Issue[]> {
  const issues: Issue[] = [];
  if (!(await findRoom(db, unitId, input.roomId))) issues.push({ path: 'roomId', message: 'No such room in this unit' });
  const member = async (id: string, role: 'endoscopist' | 'nurse') => uuidSchema.safeParse(id).success && hasRole(db, unitId, id, role);
  if (!(await member(input.endoscopistId, 'endoscopist'))) issues.push({ path: 'endoscopistId', message: 'Not an endoscopist of this unit' });
  if (!(await member(input.nurseId, 'nurse'))) issues.push({ path: 'nurseId', message: 'Not a nurse of this unit' });
  return issues;
}

/**
 * What a repeat of a schedule request must match in the case it made: the same author, and every field
 * as stored. A difference is named field by field (a form edited after its answer was lost).
 */
function repeatIssues(row: CaseRecord, actor: Actor, input: ScheduleCaseInput): Issue[] {
  if (row.createdBy !== actor.userId) return [{ path: 'id', message: 'Already used for another case' }];
  const fields: [path: string, stored: unknown, sent: unknown][] = [
    ['patient.hospitalNumber', row.hospitalNumber, input.patient.hospitalNumber],
    ['procedureType', row.procedureType, input.procedureType],
    ['indication', row.indication, input.indication],
    ['lesion.site', row.lesionSite, input.lesion.site],
    ['lesion.sizeMm', row.lesionSizeMm, input.lesion.sizeMm],
    ['lesion.paris', row.lesionParis, input.lesion.paris],
    ['roomId', row.roomId, input.roomId],
    ['scheduledAt', row.scheduledAt.getTime(), Date.parse(input.scheduledAt)],
    ['sedation', row.sedation, input.sedation],
    ['endoscopistId', row.endoscopistId, input.endoscopistId],
    ['nurseId', row.nurseId, input.nurseId],
  ];
  return fields.filter(([, stored, sent]) => stored !== sent).map(([path]) => ({ path, message: 'Differs from the case this form already scheduled' }));
}

/**
 * The case an earlier request with this id made, or null when there is none. A case of another unit
 * with the id is answered as taken, and shows nothing of that case.
 */
async function earlierSchedule(db: Db, actor: Actor, id: string, input: ScheduleCaseInput): Promise<CaseSummary | null> {
  const row = await findCaseRecord(db, actor.unitId, id);
  if (!row) return null;
  const issues = repeatIssues(row, actor, input);
  if (issues.length) throw conflict('A case was already scheduled with this id and other details; open it from the day list', issues);
  return toSummary(row);
}

/**
 * Schedule a case: the patient is reused by hospital number within the unit, or made. With an `id`, a
 * repeat of the request answers the case it made (`created: false`), also when both arrive at once.
 */
export async function scheduleCase(db: Db, actor: Actor, input: ScheduleCaseInput, audit: Auditor): Promise<{ summary: CaseSummary; created: boolean }> {
  const requestId = input.id;
  const earlier = requestId ? await earlierSchedule(db, actor, requestId, input) : null;
  if (earlier) return { summary: earlier, created: false };
  const issues = await checkTeamAndRoom(db, actor.unitId, input);
  if (issues.length) throw badRequest(`Cannot schedule: ${issues.map((i) => `${i.path}: ${i.message}`).join('; ')}`, issues);
  let id: string;
  try {
    id = await db.transaction(async (tx) => {
      const patient = await reuseOrCreatePatient(tx, actor.unitId, input.patient);
      const caseId = await insertCase(tx, {
        ...(requestId ? { id: requestId } : {}),
        unitId: actor.unitId, patientId: patient.id, roomId: input.roomId, procedureType: input.procedureType,
        indication: input.indication, lesionSite: input.lesion.site, lesionSizeMm: input.lesion.sizeMm,
        lesionParis: input.lesion.paris, sedation: input.sedation, endoscopistId: input.endoscopistId,
        nurseId: input.nurseId, scheduledAt: new Date(input.scheduledAt), createdBy: actor.userId,
      });
      await audit(tx, { action: 'case.schedule', entityType: 'case', entityId: caseId, detail: { patientId: patient.id } });
      return caseId;
    });
  } catch (err) {
    if (!requestId || !isUniqueViolation(err, 'cases_pkey')) throw err;
    // The same request twice at once: the one stored answers both. Else the id is another unit's.
    const raced = await earlierSchedule(db, actor, requestId, input);
    if (raced) return { summary: raced, created: false };
    throw conflict('This case id is taken; schedule the case again from a new form', [{ path: 'id', message: 'Already used' }]);
  }
  const row = await findCaseRecord(db, actor.unitId, id);
  if (!row) throw new Error(`case ${id} vanished after insert`);
  return { summary: toSummary(row), created: true };
}

/**
 * One case of the actor's unit. Another unit's case answers 404, the same as no case, so that case ids
 * reveal nothing across units. Every read is written to the audit log (PRODUCT.md, Roles).
 */
export async function getCase(db: Db, actor: Actor, caseId: string, audit: Auditor): Promise<CaseDetail> {
  const row = await caseOfUnit(db, actor, caseId);
  await audit(db, { action: 'case.view', entityType: 'case', entityId: caseId, detail: { patientId: row.patientId } });
  return toDetail(row);
}

/** Cancel a case that has not begun; a case being recorded or done is never cancelled (409). */
export async function cancelCase(db: Db, actor: Actor, caseId: string, input: CancelCaseInput, audit: Auditor): Promise<CaseDetail> {
  const before = await caseOfUnit(db, actor, caseId);
  await db.transaction(async (tx) => {
    const done = await cancelScheduledCase(tx, actor.unitId, caseId, input.reason ?? null);
    if (!done) throw conflict(`Only a scheduled case can be cancelled; this one is ${before.status}`);
    await audit(tx, { action: 'case.cancel', entityType: 'case', entityId: caseId, detail: input.reason ? { reason: input.reason } : null });
  });
  const after = await findCaseRecord(db, actor.unitId, caseId);
  if (!after) throw new Error(`case ${caseId} vanished after cancel`);
  return toDetail(after);
}
