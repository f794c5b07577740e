import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { deviceUsages } from '#server/db/schema/index.ts';
import { deviceUsageSchema } from '#shared/schemas/device-usages.ts';
import { createTestContext, type TestContext } from './helpers/app.ts';
import { addItem, api, buildWard, caseFor, inventedGtin, newId, record, tap, type Ward } from './record-fixtures.ts';

let t: TestContext;
let w: Ward;
let other: Ward;

beforeAll(async () => {
  t = await createTestContext();
  [w, other] = await Promise.all([buildWard(t), buildWard(t)]);
});
afterAll(() => t.close());

// GS1's example GTIN (GS1 General Specifications, AI (01) examples; from memory). Expiry far ahead so it is in date.
const GTIN = '09506000134352';
const GS = '\u001d';
const scan = (lot: string, expiry = '391231') => `01${GTIN}17${expiry}10${lot}${GS}21SN-${lot}`;

describe('recording a scanned device', () => {
  it('reads the scan on the server: GTIN, lot, serial and expiry, matched to the catalogue item', async () => {
    const item = await addItem(t, w, { gtin: GTIN });
    const c = await caseFor(t, w);
    const res = await api(t, w.cookies.nurse).post(`/api/cases/${c.id}/device-usages`, { rawScan: scan('A1') });
    expect(res.status).toBe(201);
    // AI (17) 391231 is 31 Dec 2039 by GS1's century window from a reference year in the 2020s (GS1 General Specifications §7.12).
    expect(deviceUsageSchema.parse(res.body)).toMatchObject({
      scheme: 'gs1', gtin: GTIN, lot: 'A1', serial: 'SN-A1', expiry: '2039-12-31', itemId: item.id, warnings: [], eventId: null,
    });
  });

  it('never takes the client\'s own reading: a body with lot or gtin fields is refused, naming them', async () => {
    const c = await caseFor(t, w);
    const res = await api(t, w.cookies.nurse).post(`/api/cases/${c.id}/device-usages`, { rawScan: scan('B2'), lot: 'FORGED', gtin: GTIN });
    expect(res.status).toBe(400);
    expect(res.body.error).toMatch(/lot|gtin/);
  });

  it('takes the group separator typed as "<GS>" as a scanner without the control character sends it', async () => {
    const c = await caseFor(t, other);
    const res = await api(t, other.cookies.nurse).post(`/api/cases/${c.id}/device-usages`, { rawScan: `01${GTIN}10LOT7<GS>21SER7` });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ lot: 'LOT7', serial: 'SER7', warnings: ['not_in_catalogue'] });
    const [row] = await t.db.select().from(deviceUsages).where(eq(deviceUsages.id, res.body.id));
    expect(row!.rawScan).toBe(`01${GTIN}10LOT7${GS}21SER7`);
  });

  it('warns of an expired item but keeps the record of its use', async () => {
    const c = await caseFor(t, w);
    // 200131 = 31 Jan 2020, before any day these tests run.
    const res = await api(t, w.cookies.nurse).post(`/api/cases/${c.id}/device-usages`, { rawScan: scan('OLD', '200131') });
    expect(res.status).toBe(201);
    expect(res.body.expiry).toBe('2020-01-31');
    expect(res.body.warnings).toContain('expired');
  });

  it('refuses a scan whose GTIN check digit fails, naming rawScan and the digit it should be', async () => {
    const c = await caseFor(t, w);
    const res = await api(t, w.cookies.nurse).post(`/api/cases/${c.id}/device-usages`, { rawScan: '0109506000134353' });
    expect(res.status).toBe(400);
    expect(res.body.issues).toEqual([{ path: 'rawScan', message: expect.stringContaining('should be 2, not 3') }]);
  });

  it('matches an HIBC code to the item with its labeler and product code', async () => {
    // "+H629CLIP1101" → values + 41, H 17, 6, 2, 9, C 12, L 21, I 18, P 25, 1, 1, 0, 1 = 154; 154 mod 43 = 25 = "P"
    // (HIBC mod-43 table: 0–9, A–Z = 10–35, "+" = 41; HIBC Supplier Labeling Standard, check character).
    const item = await addItem(t, other, { gtin: null, hibccLabeler: 'H629', hibccProduct: 'CLIP110' });
    const c = await caseFor(t, other);
    const res = await api(t, other.cookies.endoscopist).post(`/api/cases/${c.id}/device-usages`, { rawScan: '+H629CLIP1101P' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ scheme: 'hibcc', itemId: item.id, warnings: [] });
  });

  it('attaches the scan to a device tap already stored, and asks to retry for a tap still on its way', async () => {
    const item = await addItem(t, w);
    const c = await caseFor(t, w);
    const clip = tap(c.id, w.members.nurse.id, 'clip_fired', 5, { outcome: 'deployed' });
    await record(t, w.cookies.nurse, c.id, [clip]);
    const attached = await api(t, w.cookies.nurse).post(`/api/cases/${c.id}/device-usages`, { eventId: clip.id, itemId: item.id, manual: { lot: 'HAND-1', expiry: '2039-01-31' } });
    expect(attached.status).toBe(201);
    expect(attached.body).toMatchObject({ scheme: 'manual', eventId: clip.id, lot: 'HAND-1', itemId: item.id });

    const notYet = await api(t, w.cookies.nurse).post(`/api/cases/${c.id}/device-usages`, { eventId: newId(), rawScan: scan('C3') });
    expect(notYet.status).toBe(409);
    expect(notYet.body.issues[0].path).toBe('eventId');

    const remark = tap(c.id, w.members.nurse.id, 'remark', 6, { text: 'Invented remark' });
    await record(t, w.cookies.nurse, c.id, [remark]);
    const wrongKind = await api(t, w.cookies.nurse).post(`/api/cases/${c.id}/device-usages`, { eventId: remark.id, rawScan: scan('C4') });
    expect(wrongKind.status).toBe(400);
    expect(wrongKind.body.issues[0].path).toBe('eventId');
  });

  it('refuses an item chosen by hand that the scan contradicts', async () => {
    const scanned = await addItem(t, w);
    const chosen = await addItem(t, w);
    const c = await caseFor(t, w);
    const res = await api(t, w.cookies.nurse).post(`/api/cases/${c.id}/device-usages`, { itemId: chosen.id, rawScan: `01${scanned.gtin}10L9` });
    expect(res.status).toBe(400);
    expect(res.body.issues[0]).toEqual({ path: 'itemId', message: `The code names "${scanned.description}"` });
  });

  it('refuses an item chosen by hand whose GTIN the scan contradicts, also when the scanned GTIN is in no catalogue item', async () => {
    const chosen = await addItem(t, w);
    const c = await caseFor(t, w);
    const res = await api(t, w.cookies.nurse).post(`/api/cases/${c.id}/device-usages`, { itemId: chosen.id, rawScan: `01${inventedGtin()}10L9` });
    expect(res.status).toBe(400);
    expect(res.body.issues[0]).toEqual({ path: 'itemId', message: `The code is not that of "${chosen.description}"` });
    // The item's own GTIN is taken, matched to it.
    const own = await api(t, w.cookies.nurse).post(`/api/cases/${c.id}/device-usages`, { itemId: chosen.id, rawScan: `01${chosen.gtin}10L9` });
    expect(own.status).toBe(201);
    expect(own.body).toMatchObject({ itemId: chosen.id, gtin: chosen.gtin, lot: 'L9' });
  });

  it('answers a repeat with the stored usage after the sign-out closed the record (a retry after a lost answer)', async () => {
    const c = await caseFor(t, w);
    const id = newId();
    expect((await api(t, w.cookies.nurse).post(`/api/cases/${c.id}/device-usages`, { id, rawScan: scan('LATE') })).status).toBe(201);
    await record(t, w.cookies.nurse, c.id, [tap(c.id, w.members.nurse.id, 'sign_out', 62, { items: [{ key: 'counts', label: 'Device counts reconciled', answer: 'yes' }] })]);
    const again = await api(t, w.cookies.nurse).post(`/api/cases/${c.id}/device-usages`, { id, rawScan: scan('LATE') });
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ id, lot: 'LATE' });
    // A new scan is refused now.
    expect((await api(t, w.cookies.nurse).post(`/api/cases/${c.id}/device-usages`, { id: newId(), rawScan: scan('NEW') })).status).toBe(409);
  });

  it('answers the same usage sent several times at once with 201 once and the stored usage after, never a 500', async () => {
    const c = await caseFor(t, w);
    const id = newId();
    const answers = await Promise.all(Array.from({ length: 4 }, () => api(t, w.cookies.nurse).post(`/api/cases/${c.id}/device-usages`, { id, rawScan: scan('RACE') })));
    expect(answers.map((r) => r.status).sort()).toEqual([200, 200, 200, 201]);
    expect(answers.every((r) => r.body.id === id)).toBe(true);
    expect(await t.db.select().from(deviceUsages).where(eq(deviceUsages.caseId, c.id))).toHaveLength(1);
  });

  it('stores a repeat with the same id once (a retry after a lost answer)', async () => {
    const c = await caseFor(t, w);
    const id = newId();
    const first = await api(t, w.cookies.nurse).post(`/api/cases/${c.id}/device-usages`, { id, rawScan: scan('R1') });
    const again = await api(t, w.cookies.nurse).post(`/api/cases/${c.id}/device-usages`, { id, rawScan: scan('R1') });
    expect([first.status, again.status]).toEqual([201, 200]);
    expect(again.body.id).toBe(id);
    expect(await t.db.select().from(deviceUsages).where(eq(deviceUsages.caseId, c.id))).toHaveLength(1);
  });

  it('is written by nurses and endoscopists only, only while the record is open, only in their unit', async () => {
    const open = await caseFor(t, w);
    expect((await api(t, w.cookies.supervisor).post(`/api/cases/${open.id}/device-usages`, { rawScan: scan('S1') })).status).toBe(403);
    expect((await api(t, w.cookies.admin).post(`/api/cases/${open.id}/device-usages`, { rawScan: scan('S1') })).status).toBe(403);
    expect((await api(t, other.cookies.nurse).post(`/api/cases/${open.id}/device-usages`, { rawScan: scan('S1') })).status).toBe(404);
    const closed = await caseFor(t, w, { status: 'closed', closedAt: new Date() });
    const late = await api(t, w.cookies.nurse).post(`/api/cases/${closed.id}/device-usages`, { rawScan: scan('S2') });
    expect(late.status).toBe(409);
    expect(late.body.error).toMatch(/closed/);
    expect((await api(t, w.cookies.supervisor).get(`/api/cases/${closed.id}/device-usages`)).status).toBe(200);
  });

  it('refuses a scan with a NUL character with 400 naming rawScan (a 500 was retried by the tablet for ever)', async () => {
    const c = await caseFor(t, w);
    const res = await api(t, w.cookies.nurse).post(`/api/cases/${c.id}/device-usages`, { id: newId(), rawScan: `https://id.example.test/01/${GTIN}?linkType=a\u0000` });
    expect(res.status).toBe(400);
    expect(res.body.issues).toEqual([{ path: 'rawScan', message: 'contains a NUL character or a broken character, which cannot be stored' }]);
  });

  it('needs either a scan or a typed label, naming the field', async () => {
    const c = await caseFor(t, w);
    const res = await api(t, w.cookies.nurse).post(`/api/cases/${c.id}/device-usages`, {});
    expect(res.status).toBe(400);
    expect(res.body.issues[0].path).toBe('rawScan');
    const manual = await api(t, w.cookies.nurse).post(`/api/cases/${c.id}/device-usages`, { manual: { lot: 'X' } });
    expect(manual.body.issues[0].path).toBe('itemId');
  });
});
