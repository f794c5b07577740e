import type { Db } from '#server/db/client.ts';
import type { Auditor } from '#server/http/audit.ts';
import type { Actor } from '#server/http/session.ts';
import type { RecordView } from '#shared/schemas/record.ts';
import { listUsages } from '../device-usages/queries.ts';
import { listSpecimens } from '../specimens/queries.ts';
import { caseOfUnit } from '../cases/access.ts';
import { recordPdf } from './pdf.ts';
import { catalogueById, namesOf, recordInputs } from './queries.ts';
import { buildRecordView } from './view.ts';

/** Everything the record joins, read in one repeatable-read snapshot so the parts agree with each other. */
async function loadView(db: Db, actor: Actor, caseId: string, now: Date): Promise<{ view: RecordView; patientId: string }> {
  return db.transaction(async (tx) => {
    const caseRow = await caseOfUnit(tx, actor, caseId);
    const [events, usages, specimens, items] = [await recordInputs(tx, caseId), await listUsages(tx, caseId), await listSpecimens(tx, caseId), await catalogueById(tx, actor.unitId)];
    const people = await namesOf(tx, [caseRow.endoscopistId, caseRow.nurseId, ...events.flatMap((e) => (e.author ? [e.author] : []))]);
    const view = buildRecordView({ caseRow, events, usages, specimens, items, people, timeZone: actor.timeZone, now });
    return { view, patientId: caseRow.patientId };
  }, { isolationLevel: 'repeatable read', accessMode: 'read only' });
}

/** The record of a case; every view is written to the audit log (PRODUCT.md, Roles). */
export async function recordOf(db: Db, actor: Actor, caseId: string, audit: Auditor, now = new Date()): Promise<RecordView> {
  const { view, patientId } = await loadView(db, actor, caseId, now);
  await audit(db, { action: 'record.view', entityType: 'case', entityId: caseId, detail: { patientId, format: 'page' } });
  return view;
}

/** The record as PDF, from the same view as the page. */
export async function recordPdfOf(db: Db, actor: Actor, caseId: string, audit: Auditor, now = new Date()): Promise<Buffer> {
  const { view, patientId } = await loadView(db, actor, caseId, now);
  const pdf = await recordPdf(view);
  await audit(db, { action: 'record.view', entityType: 'case', entityId: caseId, detail: { patientId, format: 'pdf' } });
  return pdf;
}
