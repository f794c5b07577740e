import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { v7 as uuidv7 } from 'uuid';
import { and, eq } from 'drizzle-orm';
import { auditLog, patients } from '#server/db/schema/index.ts';
import { caseDetailSchema } from '#shared/schemas/api-cases.ts';
import { caseSummarySchema } from '#shared/schemas/cases.ts';
import { createTestContext, type TestContext } from './helpers/app.ts';
import { asBrowser, buildMember, buildTeam, scheduleInput, signIn, type TestMember, type TestUnit } from './factories.ts';

let t: TestContext;
let unit: TestUnit;
let team: { nurse: TestMember; endoscopist: TestMember };
let nurseCookie: string;

beforeAll(async () => {
  t = await createTestContext();
  const built = await buildTeam(t);
  unit = built.unit;
  team = built.members;
  nurseCookie = await signIn(t, team.nurse);
});
afterAll(() => t.close());

const post = (path: string, body: unknown, cookie = nurseCookie) => request(t.app).post(path).set(asBrowser(cookie)).send(body as object);
const get = (path: string, cookie = nurseCookie) => request(t.app).get(path).set(asBrowser(cookie));

describe('scheduling a case', () => {
  it('a nurse schedules a case and finds it on the day list, then opens it', async () => {
    const input = scheduleInput(unit, team, { scheduledAt: '2031-05-06T09:30:00.000Z' });
    const created = await post('/api/cases', input);
    expect(created.status).toBe(201);
    const summary = caseSummarySchema.parse(created.body);
    expect(summary).toMatchObject({
      status: 'scheduled', procedureType: 'esd', unitId: unit.id, scheduledAt: '2031-05-06T09:30:00.000Z',
      room: { id: unit.rooms[0]!.id, name: 'Room 1' },
      patient: { hospitalNumber: input.patient.hospitalNumber, familyName: input.patient.familyName, birthDate: '1960-05-17' },
      lesion: { site: 'gastric antrum', sizeMm: 30, paris: '0-IIa' },
      endoscopist: { id: team.endoscopist.id, name: team.endoscopist.name },
      nurse: { id: team.nurse.id, name: team.nurse.name },
    });

    const day = await get('/api/cases?date=2031-05-06');
    expect(day.status).toBe(200);
    expect(day.body.map((c: { id: string }) => c.id)).toEqual([summary.id]);
    expect((await get('/api/cases?date=2031-05-07')).body).toEqual([]);
    expect((await get(`/api/cases?date=2031-05-06&status=cancelled`)).body).toEqual([]);
    expect((await get(`/api/cases?date=2031-05-06&roomId=${unit.rooms[1]!.id}`)).body).toEqual([]);

    const detail = await get(`/api/cases/${summary.id}`);
    expect(detail.status).toBe(200);
    expect(caseDetailSchema.parse(detail.body)).toMatchObject({ id: summary.id, lastSeq: 0, closedAt: null, cancelledAt: null });
  });

  it('lists today in the unit\'s own calendar when no date is given', async () => {
    const created = await post('/api/cases', scheduleInput(unit, team, { scheduledAt: new Date().toISOString() }));
    const today = await get('/api/cases');
    expect(today.body.map((c: { id: string }) => c.id)).toContain(created.body.id);
  });

  it('writes every view of a patient\'s record to the audit log, with who and from where', async () => {
    const created = await post('/api/cases', scheduleInput(unit, team));
    await get(`/api/cases/${created.body.id}`);
    await get(`/api/cases/${created.body.id}`);
    const views = await t.db.select().from(auditLog).where(and(eq(auditLog.action, 'case.view'), eq(auditLog.entityId, created.body.id)));
    expect(views).toHaveLength(2);
    expect(views[0]).toMatchObject({ userId: team.nurse.id, unitId: unit.id, entityType: 'case', detail: { patientId: created.body.patient.id } });
    expect(views[0]!.ip).toMatch(/127\.0\.0\.1/);
    const scheduled = await t.db.select().from(auditLog).where(and(eq(auditLog.action, 'case.schedule'), eq(auditLog.entityId, created.body.id)));
    expect(scheduled).toHaveLength(1);
  });

  it('writes a day list that names patients to the audit log, with the patients it showed', async () => {
    const created = await post('/api/cases', scheduleInput(unit, team, { scheduledAt: '2031-07-08T10:00:00.000Z' }));
    const listed = await get('/api/cases?date=2031-07-08');
    expect(listed.body).toHaveLength(1);
    await get('/api/cases?date=2031-07-09'); // an empty day shows no one
    const entries = await t.db.select().from(auditLog).where(and(eq(auditLog.action, 'cases.list'), eq(auditLog.userId, team.nurse.id)));
    const ours = entries.filter((e) => JSON.stringify(e.detail).includes('2031-07-0'));
    expect(ours).toHaveLength(1);
    expect(ours[0]).toMatchObject({
      unitId: unit.id, entityType: 'unit', entityId: unit.id,
      detail: { date: '2031-07-08', roomId: null, status: null, caseIds: [created.body.id], patientIds: [created.body.patient.id] },
    });
    expect(ours[0]!.ip).toMatch(/127\.0\.0\.1/);
  });

  it('reuses the unit\'s patient for a hospital number already on file', async () => {
    const input = scheduleInput(unit, team);
    const first = await post('/api/cases', input);
    const again = await post('/api/cases', scheduleInput(unit, team, { patient: input.patient, procedureType: 'emr' }));
    expect(again.status).toBe(201);
    expect(again.body.patient.id).toBe(first.body.patient.id);
    const rows = await t.db.select().from(patients).where(and(eq(patients.unitId, unit.id), eq(patients.hospitalNumber, input.patient.hospitalNumber)));
    expect(rows).toHaveLength(1);
  });

  it('a repeat of one request (its answer lost, or sent twice at once) makes one case and answers it', async () => {
    const id = uuidv7();
    const input = { ...scheduleInput(unit, team, { scheduledAt: '2031-06-02T08:00:00.000Z' }), id };
    const first = await post('/api/cases', input);
    expect(first.status).toBe(201);
    expect(first.body.id).toBe(id);
    const again = await post('/api/cases', input);
    expect(again.status).toBe(200);
    expect(again.body).toEqual(first.body);
    // Both at once: one insert wins, the other is answered with its case.
    const racedId = uuidv7();
    const raced = { ...scheduleInput(unit, team, { scheduledAt: '2031-06-02T09:00:00.000Z' }), id: racedId };
    const both = await Promise.all([post('/api/cases', raced), post('/api/cases', raced)]);
    expect(both.map((r) => r.status).sort()).toEqual([200, 201]);
    expect(both[0]!.body).toEqual(both[1]!.body);
    const day = await get('/api/cases?date=2031-06-02');
    expect(day.body.map((c: { id: string }) => c.id).sort()).toEqual([id, racedId].sort());
    const audited = await t.db.select().from(auditLog).where(and(eq(auditLog.action, 'case.schedule'), eq(auditLog.entityId, id)));
    expect(audited).toHaveLength(1);
  });

  it('refuses a case id used before for other details, or by another user, or in another unit', async () => {
    const id = uuidv7();
    const input = { ...scheduleInput(unit, team), id };
    expect((await post('/api/cases', input)).status).toBe(201);
    const edited = await post('/api/cases', { ...input, lesion: { ...input.lesion, sizeMm: 31 } });
    expect(edited.status).toBe(409);
    expect(edited.body.error).toMatch(/already scheduled .* other details/i);
    expect(edited.body.issues).toEqual([{ path: 'lesion.sizeMm', message: expect.stringMatching(/^Differs/) }]);
    const byOther = await post('/api/cases', input, await signIn(t, team.endoscopist));
    expect(byOther.status).toBe(409);
    const other = await buildTeam(t);
    const elsewhere = await post('/api/cases', { ...scheduleInput(other.unit, other.members), id }, await signIn(t, other.members.nurse));
    expect(elsewhere.status).toBe(409);
    expect(JSON.stringify(elsewhere.body)).not.toContain(input.patient.hospitalNumber);
    expect((await get(`/api/cases/${id}`)).body.lesion.sizeMm).toBe(30);
  });

  it('refuses a hospital number whose date of birth and name disagree with the file, naming each field', async () => {
    const first = await post('/api/cases', scheduleInput(unit, team));
    const clash = scheduleInput(unit, team);
    clash.patient = { ...clash.patient, hospitalNumber: first.body.patient.hospitalNumber, birthDate: '1971-01-01' };
    const res = await post('/api/cases', clash);
    expect(res.status).toBe(409);
    expect(res.body.issues.map((i: { path: string }) => i.path)).toEqual(['patient.familyName', 'patient.birthDate']);
  });

  it('refuses a room, endoscopist or nurse that is not the unit\'s in that role, naming the field', async () => {
    const outsider = await buildTeam(t);
    const res = await post('/api/cases', scheduleInput(unit, team, {
      roomId: outsider.unit.rooms[0]!.id, endoscopistId: team.nurse.id, nurseId: outsider.members.nurse.id,
    }));
    expect(res.status).toBe(400);
    expect(res.body.issues).toEqual([
      { path: 'roomId', message: 'No such room in this unit' },
      { path: 'endoscopistId', message: 'Not an endoscopist of this unit' },
      { path: 'nurseId', message: 'Not a nurse of this unit' },
    ]);
  });

  it('an endoscopist schedules too; the team may be any of the unit\'s endoscopists and nurses', async () => {
    const second = await buildMember(t, unit, 'endoscopist');
    const res = await post('/api/cases', scheduleInput(unit, { ...team, endoscopist: second }), await signIn(t, team.endoscopist));
    expect(res.status).toBe(201);
    expect(res.body.endoscopist.id).toBe(second.id);
  });
});

describe('cancelling a case', () => {
  it('cancels a scheduled case with its reason, and refuses to cancel it twice', async () => {
    const created = await post('/api/cases', scheduleInput(unit, team));
    const res = await post(`/api/cases/${created.body.id}/cancel`, { reason: 'Patient unwell on arrival' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'cancelled', cancelReason: 'Patient unwell on arrival' });
    expect(res.body.cancelledAt).toEqual(expect.any(String));
    const again = await post(`/api/cases/${created.body.id}/cancel`, {});
    expect(again.status).toBe(409);
    expect(again.body.error).toBe('Only a scheduled case can be cancelled; this one is cancelled');
  });
});

describe('the schedule form\'s lists', () => {
  it('lists the unit\'s members of one role, or all of them for an empty role', async () => {
    const nurses = await get('/api/members?role=nurse');
    expect(nurses.body).toEqual([{ userId: team.nurse.id, name: team.nurse.name, email: team.nurse.email, role: 'nurse' }]);
    const all = await get('/api/members?role=');
    expect(all.body.map((m: { role: string }) => m.role)).toEqual(expect.arrayContaining(['nurse', 'endoscopist', 'supervisor', 'admin']));
  });

  it('lists the unit\'s rooms by name', async () => {
    const res = await get('/api/rooms');
    expect(res.body).toEqual(unit.rooms.map((r) => ({ id: r.id, name: r.name, unitId: unit.id })));
  });
});
