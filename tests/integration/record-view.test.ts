import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { auditLog } from '#server/db/schema/index.ts';
import { recordViewSchema, type RecordView } from '#shared/schemas/record.ts';
import { createTestContext, type TestContext } from './helpers/app.ts';
import { api, buildWard, caseFor, newId, record, recordScenario, tap, type Ward } from './record-fixtures.ts';

let t: TestContext;
let w: Ward;
let other: Ward;
let s: Awaited<ReturnType<typeof recordScenario>>;
let view: RecordView;

beforeAll(async () => {
  t = await createTestContext();
  [w, other] = await Promise.all([buildWard(t), buildWard(t)]);
  s = await recordScenario(t, w);
  const res = await api(t, w.cookies.supervisor).get(`/api/cases/${s.caseRow.id}/record`);
  if (res.status !== 200) throw new Error(`record: ${res.status} ${JSON.stringify(res.body)}`);
  view = recordViewSchema.parse(res.body);
});
afterAll(() => t.close());

describe('the record of a case', () => {
  it('shows the patient, the case, the team and both checks with who did them', () => {
    expect(view.case).toMatchObject({ id: s.caseRow.id, status: 'closed', procedureType: 'esd', room: 'Room 1' });
    expect(view.team).toEqual({ endoscopist: { id: w.members.endoscopist.id, name: w.members.endoscopist.name }, nurse: { id: w.members.nurse.id, name: w.members.nurse.name } });
    expect(view.checks.timeOut).toMatchObject({ status: 'present', at: '2025-03-14T09:02:00.000Z', by: { name: w.members.nurse.name } });
    expect(view.checks.timeOut.items).toContainEqual({ key: 'anticoagulants', label: 'Anticoagulants held', answer: 'no', note: 'Invented: aspirin continued' });
    expect(view.checks.signOut).toMatchObject({ status: 'present', at: '2025-03-14T10:02:00.000Z' });
  });

  it('counts clips deployed and misfired and the loop, leaving the voided clip out', () => {
    // Taps of the scenario: two clips deployed (minutes 22 and 50), one misfired (23), one voided (51), one loop (52).
    expect(view.counts).toMatchObject({ clipsDeployed: 2, clipsMisfired: 1, loopsPlaced: 1, bleeds: 1, bleedsOpen: 0, injections: 1, injectionMl: 5 });
    expect(view.voided).toEqual([{ id: s.voidedClip.id, label: 'Clip fired', at: '2025-03-14T09:51:00.000Z' }]);
  });

  it('gives the device table per item with the lot of the scan attached after the tap, not the voided tap\'s', () => {
    const clip = view.devices.find((d) => d.itemId === s.clipItem.id)!;
    // The closure clip named no item; the scan attached to it names the clip item, so it counts there.
    expect(clip).toMatchObject({ deployed: 2, misfired: 1, inPatient: 2, type: 'clip', sizeLabel: '11 mm' });
    expect(clip.lots).toEqual([{ lot: 'CLIPLOT-7', expiry: '2039-12-31', count: 1, expired: false }]);
    expect(view.devices.find((d) => d.itemId === s.loopItem.id)).toMatchObject({ deployed: 1, inPatient: 1, lots: [] });
    expect(view.devices.some((d) => d.itemId === 'unspecified')).toBe(false);
    const voidedScan = view.usages.find((u) => u.lot === 'VOIDLOT')!;
    expect(voidedScan).toMatchObject({ eventId: s.voidedClip.id, eventVoided: true, eventLabel: 'Clip fired' });
  });

  it('gives the bleed episode with its time to haemostasis, attempts and clips', () => {
    // Bleed at minute 20, haemostasis achieved at 24.5: 270 s. Attempts: the haemostasis tap and the haemostasis clip.
    expect(view.bleeds).toEqual([expect.objectContaining({
      bleedId: s.bleed.id, start: '2025-03-14T09:20:00.000Z', controlledAt: '2025-03-14T09:24:30.000Z', secondsToHaemostasis: 270,
      severity: 'spurting', vesselMm: 2, attempts: 2, clips: 1, methods: ['clip'], openAtScopeOut: false,
    })]);
  });

  it('lays out phases and the timeline by phase, in time order', () => {
    expect(view.phases.map((p) => [p.name, p.minutes])).toEqual([['total', 55], ['resection', 32], ['closure', 5], ['retrieval', 5]]);
    expect(view.sections.map((x) => x.key)).toEqual(['before_scope', 'scope_in', 'resection', 'retrieval', 'closure', 'scope_in', 'after_scope']);
    const resection = view.sections.find((x) => x.key === 'resection')!;
    expect(resection.entries.map((e) => e.label)).toEqual(['Marking', 'Injection', 'Incision', 'Dissection', 'Bleed', 'Clip deployed', 'Clip misfired', 'Haemostasis achieved', 'Remark', 'Resection complete']);
    expect(resection.entries.find((e) => e.kind === 'bleed')!.detail).toBe('spurting, vessel 2 mm');
    const all = view.sections.flatMap((x) => x.entries.map((e) => Date.parse(e.at)));
    expect(all).toEqual([...all].sort((a, b) => a - b));
  });

  it('lists the specimen with its measured size and area, and the computed notes with the caution', () => {
    // Ellipse area π/4 · 30 · 20 = 471.24 mm² (shared/domain/geometry.ts, Archimedes); speed over the 32 min resection.
    expect(view.specimens).toEqual([expect.objectContaining({ id: s.specimenId, label: 'A', retrievedAt: '2025-03-14T09:45:00.000Z', retrievalMethod: 'net', longMm: 30, shortMm: 20, containerId: 'POT-1', handoffStatus: 'pending' })]);
    expect(view.specimens[0]!.areaMm2).toBeCloseTo((Math.PI / 4) * 30 * 20, 6);
    expect(view.specimenSummary.resectionSpeedMm2PerMin).toBeCloseTo(((Math.PI / 4) * 600) / 32, 6);
    expect(view.notes.map((x) => x.kind)).toEqual(['specimen_area', 'resection_speed', 'defect_perimeter']);
    for (const note of view.notes) expect(note.caution).toMatch(/not advice/);
    expect(view.caution).toMatch(/no clinical advice/);
  });

  it('gives a retrieval tapped but not listed the id its tap made, and joins it to the specimen listed under that id', async () => {
    const c = await caseFor(t, w, { procedureType: 'emr', status: 'recording' });
    const n = w.members.nurse.id;
    const madeId = newId();
    await record(t, w.cookies.nurse, c.id, [
      tap(c.id, n, 'specimen_retrieved', 10, { method: 'snare', pieces: 1, specimenId: madeId }),
      tap(c.id, n, 'specimen_retrieved', 12, { method: 'net' }), // a tap from before taps made specimen ids
    ]);
    const read = async () => recordViewSchema.parse((await api(t, w.cookies.nurse).get(`/api/cases/${c.id}/record`)).body).specimens;
    expect(await read()).toEqual([
      expect.objectContaining({ id: null, tapSpecimenId: madeId, retrievedAt: '2025-03-14T09:10:00.000Z', retrievalMethod: 'snare', pieces: 1 }),
      expect.objectContaining({ id: null, tapSpecimenId: null, retrievedAt: '2025-03-14T09:12:00.000Z', retrievalMethod: 'net' }),
    ]);
    const listed = await api(t, w.cookies.nurse).post(`/api/cases/${c.id}/specimens`, { id: madeId, label: 'A', retrievalMethod: 'snare', pieces: 1 });
    expect(listed.status).toBe(201);
    expect(await read()).toEqual([
      expect.objectContaining({ id: madeId, tapSpecimenId: null, label: 'A', retrievedAt: '2025-03-14T09:10:00.000Z' }),
      expect.objectContaining({ id: null, tapSpecimenId: null, retrievedAt: '2025-03-14T09:12:00.000Z' }),
    ]);
  });

  it('says who recorded what and when, with their names', () => {
    const byName = Object.fromEntries(view.authorship.map((a) => [a.author.name, a]));
    expect(byName[w.members.endoscopist.name]).toMatchObject({ events: 1, first: '2025-03-14T09:30:00.000Z', devices: ['tablet-room-1'] });
    // Every stored event counts, corrections included: 21 of the scenario's 22 are the nurse's.
    expect(byName[w.members.nurse.name]!.events).toBe(21);
    const remark = view.sections.flatMap((x) => x.entries).find((e) => e.kind === 'remark')!;
    expect(remark.author).toEqual({ id: w.members.endoscopist.id, name: w.members.endoscopist.name });
  });

  it('writes each view to the audit log, as the viewer', async () => {
    await api(t, w.cookies.admin).get(`/api/cases/${s.caseRow.id}/record`);
    const entries = await t.db.select().from(auditLog).where(and(eq(auditLog.entityId, s.caseRow.id), eq(auditLog.action, 'record.view')));
    const viewers = entries.filter((e) => (e.detail as { format?: string } | null)?.format === 'page').map((e) => e.userId);
    expect(viewers).toEqual(expect.arrayContaining([w.members.supervisor.id, w.members.admin.id]));
  });

  it('is readable by every role of the unit, by no other unit, and by nobody signed out', async () => {
    for (const role of ['nurse', 'endoscopist', 'admin'] as const) expect((await api(t, w.cookies[role]).get(`/api/cases/${s.caseRow.id}/record`)).status).toBe(200);
    expect((await api(t, other.cookies.supervisor).get(`/api/cases/${s.caseRow.id}/record`)).status).toBe(404);
    expect((await api(t).get(`/api/cases/${s.caseRow.id}/record`)).status).toBe(401);
    const bad = await api(t, w.cookies.nurse).get('/api/cases/nope/record');
    expect(bad.status).toBe(400);
    expect(bad.body.issues[0].path).toBe('id');
  });

  it('shows an empty case plainly: missing checks, no phases, nothing counted', async () => {
    const c = await caseFor(t, w);
    const empty = recordViewSchema.parse((await api(t, w.cookies.nurse).get(`/api/cases/${c.id}/record`)).body);
    expect(empty.checks.timeOut.status).toBe('missing');
    expect(empty.sections).toEqual([]);
    expect(empty.devices).toEqual([]);
    expect(empty.counts.clipsDeployed).toBe(0);
  });
});
