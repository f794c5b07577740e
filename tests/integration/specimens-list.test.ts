import { execFileSync } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { auditLog } from '#server/db/schema/index.ts';
import { specimenListSchema, specimenSchema } from '#shared/schemas/specimens.ts';
import { createTestContext, type TestContext } from './helpers/app.ts';
import { api, binary, buildWard, caseFor, newId, record, tap, type Ward } from './record-fixtures.ts';

let t: TestContext;
let w: Ward;
let other: Ward;

beforeAll(async () => {
  t = await createTestContext();
  [w, other] = await Promise.all([buildWard(t), buildWard(t)]);
});
afterAll(() => t.close());

const path = (caseId: string, rest = '') => `/api/cases/${caseId}/specimens${rest}`;

describe('the specimen list', () => {
  it('a nurse lists a specimen with its retrieval, pieces and size; the area is the ellipse π/4 · long · short', async () => {
    const c = await caseFor(t, w);
    const res = await api(t, w.cookies.nurse).post(path(c.id), { label: 'A', retrievalMethod: 'net', pieces: 1, longMm: 32, shortMm: 25 });
    expect(res.status).toBe(201);
    const s = specimenSchema.parse(res.body);
    expect(s).toMatchObject({ label: 'A', retrievalMethod: 'net', pieces: 1, handoffStatus: 'pending', containerId: null });
    // π/4 · 32 · 25 = 200π ≈ 628.32 mm² (area of an ellipse, Archimedes; shared/domain/geometry.ts).
    expect(s.areaMm2).toBeCloseTo(200 * Math.PI, 9);
    const list = specimenListSchema.parse((await api(t, w.cookies.supervisor).get(path(c.id))).body);
    expect(list.specimens.map((x) => x.id)).toEqual([s.id]);
  });

  it('labels and hands a specimen over, step by step, and audits each change', async () => {
    const c = await caseFor(t, w);
    const { body: s } = await api(t, w.cookies.nurse).post(path(c.id), { label: 'B' });
    const labelled = await api(t, w.cookies.nurse).patch(path(c.id, `/${s.id}`), { containerId: 'POT-22', handoffStatus: 'labelled' });
    expect(labelled.body).toMatchObject({ containerId: 'POT-22', handoffStatus: 'labelled', label: 'B' });
    const handed = await api(t, w.cookies.endoscopist).patch(path(c.id, `/${s.id}`), { handoffStatus: 'handed_over' });
    expect(handed.body).toMatchObject({ containerId: 'POT-22', handoffStatus: 'handed_over' });
    const changes = await t.db.select().from(auditLog).where(and(eq(auditLog.entityId, s.id), eq(auditLog.action, 'specimen.update')));
    expect(changes.map((x) => x.userId).sort()).toEqual([w.members.nurse.id, w.members.endoscopist.id].sort());
  });

  it('keeps the id the tablet made, so a repeated create stores one specimen', async () => {
    const c = await caseFor(t, w);
    const id = newId();
    const first = await api(t, w.cookies.nurse).post(path(c.id), { id, label: 'C' });
    const again = await api(t, w.cookies.nurse).post(path(c.id), { id, label: 'C' });
    expect([first.status, again.status]).toEqual([201, 200]);
    expect((await api(t, w.cookies.nurse).get(path(c.id))).body.specimens).toHaveLength(1);
  });

  it('answers the same specimen sent several times at once with 201 once and the stored one after, never a 500', async () => {
    const c = await caseFor(t, w);
    const id = newId();
    const answers = await Promise.all(Array.from({ length: 4 }, () => api(t, w.cookies.nurse).post(path(c.id), { id, label: 'R' })));
    expect(answers.map((r) => r.status).sort()).toEqual([200, 200, 200, 201]);
    expect((await api(t, w.cookies.nurse).get(path(c.id))).body.specimens).toHaveLength(1);
  });

  it('answers a repeated create with the stored specimen after the sign-out closed the record', async () => {
    const c = await caseFor(t, w);
    const id = newId();
    expect((await api(t, w.cookies.nurse).post(path(c.id), { id, label: 'E' })).status).toBe(201);
    await record(t, w.cookies.nurse, c.id, [tap(c.id, w.members.nurse.id, 'sign_out', 62, { items: [{ key: 'counts', label: 'Device counts reconciled', answer: 'yes' }] })]);
    const again = await api(t, w.cookies.nurse).post(path(c.id), { id, label: 'E' });
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ id, label: 'E' });
    expect((await api(t, w.cookies.nurse).post(path(c.id), { id: newId(), label: 'F' })).status).toBe(409);
  });

  it('refuses an axis below 0.1 mm, naming the field (a far smaller one would not fit the column)', async () => {
    const c = await caseFor(t, w);
    const res = await api(t, w.cookies.nurse).post(path(c.id), { label: 'G', longMm: 1e-300 });
    expect(res.status).toBe(400);
    expect(res.body.issues).toEqual([{ path: 'longMm', message: 'At least 0.1 mm' }]);
  });

  it('refuses a short axis longer than the long one, an unknown method and an unknown status, naming each field', async () => {
    const c = await caseFor(t, w);
    const axes = await api(t, w.cookies.nurse).post(path(c.id), { label: 'D', longMm: 10, shortMm: 12 });
    expect(axes.status).toBe(400);
    expect(axes.body.issues[0].path).toBe('shortMm');
    expect((await api(t, w.cookies.nurse).post(path(c.id), { label: 'D', retrievalMethod: 'forceps' })).body.issues[0].path).toBe('retrievalMethod');
    const { body: s } = await api(t, w.cookies.nurse).post(path(c.id), { label: 'D', longMm: 10 });
    expect((await api(t, w.cookies.nurse).patch(path(c.id, `/${s.id}`), { handoffStatus: 'lost' })).body.issues[0].path).toBe('handoffStatus');
    // The stored long axis counts too: a later short axis above it is refused.
    const later = await api(t, w.cookies.nurse).patch(path(c.id, `/${s.id}`), { shortMm: 11 });
    expect(later.status).toBe(409);
    expect(later.body.issues[0].path).toBe('shortMm');
  });

  it('prints a container label: a DataMatrix PNG, and a PDF naming the patient and the specimen', async () => {
    const c = await caseFor(t, w);
    const { body: s } = await api(t, w.cookies.nurse).post(path(c.id), { label: 'A — margin', containerId: 'POT-9' });
    const png = await binary(t, w.cookies.nurse, path(c.id, `/${s.id}/label.png`));
    expect(png.status).toBe(200);
    // PNG signature: 89 50 4E 47 0D 0A 1A 0A (PNG specification, ISO/IEC 15948 §5.2).
    expect((png.body as Buffer).subarray(0, 8).toString('hex')).toBe('89504e470d0a1a0a');
    const pdf = await binary(t, w.cookies.nurse, path(c.id, `/${s.id}/label.pdf?symbology=code128`));
    expect(pdf.headers['content-type']).toBe('application/pdf');
    // Read back with Poppler's pdftotext (see record-pdf.test.ts for why).
    const text = execFileSync('pdftotext', ['-layout', '-enc', 'UTF-8', '-', '-'], { input: pdf.body as Buffer }).toString('utf8');
    expect(text).toContain('Specimen A — margin');
    expect(text).toContain(`Hospital no. P-`);
    expect(text).toContain('Container POT-9');
    expect(text).toContain(s.id);
    const printed = await t.db.select().from(auditLog).where(and(eq(auditLog.entityId, s.id), eq(auditLog.action, 'specimen.label')));
    expect(printed).toHaveLength(2);
    expect((await api(t, w.cookies.nurse).get(path(c.id, `/${s.id}/label.gif`))).status).toBe(400);
  });

  it('is written by nurses and endoscopists while the record is open, read by the unit, hidden from others', async () => {
    const c = await caseFor(t, w);
    expect((await api(t, w.cookies.supervisor).post(path(c.id), { label: 'E' })).status).toBe(403);
    expect((await api(t, w.cookies.admin).post(path(c.id), { label: 'E' })).status).toBe(403);
    expect((await api(t, other.cookies.nurse).post(path(c.id), { label: 'E' })).status).toBe(404);
    expect((await api(t, other.cookies.nurse).get(path(c.id))).status).toBe(404);
    const closed = await caseFor(t, w, { status: 'closed', closedAt: new Date() });
    const late = await api(t, w.cookies.nurse).post(path(closed.id), { label: 'E' });
    expect(late.status).toBe(409);
    expect((await api(t, w.cookies.admin).get(path(closed.id))).status).toBe(200);
    expect((await api(t).get(path(closed.id))).status).toBe(401);
  });
});
