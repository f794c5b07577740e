import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { auditLog } from '#server/db/schema/index.ts';
import { catalogueItemSchema, catalogueListSchema } from '#shared/schemas/catalogue.ts';
import { createTestContext, type TestContext } from './helpers/app.ts';
import { addItem, api, buildWard, inventedGtin, type Ward } from './record-fixtures.ts';

let t: TestContext;
let w: Ward;
let other: Ward;

beforeAll(async () => {
  t = await createTestContext();
  [w, other] = await Promise.all([buildWard(t), buildWard(t)]);
});
afterAll(() => t.close());

// GS1's own example GTIN, 0950600013435 + check digit 2 (GS1 General Specifications, examples of AI (01); from memory).
const GS1_EXAMPLE_GTIN = '09506000134352';

describe('the device catalogue', () => {
  it('an admin adds an item with a GTIN, and every role of the unit reads it', async () => {
    const created = await api(t, w.cookies.admin).post('/api/catalogue', {
      description: 'Through-the-scope clip, rotatable, 11 mm opening', type: 'clip', sizeLabel: '11 mm', gtin: GS1_EXAMPLE_GTIN,
    });
    expect(created.status).toBe(201);
    const item = catalogueItemSchema.parse(created.body);
    expect(item).toMatchObject({ gtin: GS1_EXAMPLE_GTIN, active: true, hibccLabeler: null, sizeLabel: '11 mm' });
    for (const role of ['nurse', 'endoscopist', 'supervisor', 'admin'] as const) {
      const list = await api(t, w.cookies[role]).get('/api/catalogue');
      expect(list.status).toBe(200);
      expect(catalogueListSchema.parse(list.body).items.map((i) => i.id)).toContain(item.id);
    }
    const [entry] = await t.db.select().from(auditLog).where(and(eq(auditLog.entityId, item.id), eq(auditLog.action, 'catalogue.create')));
    expect(entry).toMatchObject({ userId: w.members.admin.id, unitId: w.unit.id });
  });

  it('stores a 13-digit GTIN as 14 digits with a leading zero (GS1: a GTIN is right-justified in AI (01); from memory)', async () => {
    const res = await api(t, other.cookies.admin).post('/api/catalogue', { description: 'Detachable loop, 20 mm', type: 'loop', gtin: '9506000134352' });
    expect(res.status).toBe(201);
    expect(res.body.gtin).toBe(GS1_EXAMPLE_GTIN);
    // The same item written as 14 digits is the same GTIN, so it is refused as a second entry.
    const again = await api(t, other.cookies.admin).post('/api/catalogue', { description: 'Same loop', type: 'loop', gtin: GS1_EXAMPLE_GTIN });
    expect(again.status).toBe(409);
  });

  it('refuses a GTIN whose check digit fails, naming the field and the digit it should be', async () => {
    // The check digit of 0950600013435 is 2 (same GS1 example), so …53 fails.
    const res = await api(t, other.cookies.admin).post('/api/catalogue', { description: 'Clip', type: 'clip', gtin: '09506000134353' });
    expect(res.status).toBe(400);
    expect(res.body.issues).toEqual([{ path: 'gtin', message: expect.stringContaining('should be 2, not 3') }]);
  });

  it('needs a GTIN or a whole HIBCC code, and checks the HIBCC labeler code\'s shape', async () => {
    const none = await api(t, w.cookies.admin).post('/api/catalogue', { description: 'Snare', type: 'snare' });
    expect(none.status).toBe(400);
    expect(none.body.issues[0].path).toBe('gtin');
    const half = await api(t, w.cookies.admin).post('/api/catalogue', { description: 'Snare', type: 'snare', hibccLabeler: 'H629' });
    expect(half.body.issues).toEqual([{ path: 'hibccProduct', message: expect.any(String) }]);
    // A labeler code starts with a letter (HIBC LIC primary data structure; from memory).
    const badLabeler = await api(t, w.cookies.admin).post('/api/catalogue', { description: 'Snare', type: 'snare', hibccLabeler: '1629', hibccProduct: 'SN10' });
    expect(badLabeler.body.issues[0].path).toBe('hibccLabeler');
    const ok = await api(t, w.cookies.admin).post('/api/catalogue', { description: 'Snare, 10 mm', type: 'snare', hibccLabeler: 'h629', hibccProduct: 'sn10' });
    expect(ok.status).toBe(201);
    expect(ok.body).toMatchObject({ hibccLabeler: 'H629', hibccProduct: 'SN10', gtin: null });
  });

  it('refuses a second item with a GTIN the unit already has, and an unknown type', async () => {
    const first = await addItem(t, w);
    const again = await api(t, w.cookies.admin).post('/api/catalogue', { description: 'Copy', type: 'clip', gtin: first.gtin });
    expect(again.status).toBe(409);
    expect(again.body.issues).toEqual([{ path: 'gtin', message: 'Already in the catalogue' }]);
    const badType = await api(t, w.cookies.admin).post('/api/catalogue', { description: 'Thing', type: 'stapler', gtin: inventedGtin() });
    expect(badType.status).toBe(400);
    expect(badType.body.issues[0].path).toBe('type');
  });

  it('refuses a second item with an HIBCC code the unit already has, in a new item and in an edited one', async () => {
    const product = `SN${Math.floor(Math.random() * 1e6)}`;
    const body = { description: 'Snare, 20 mm', type: 'snare', hibccLabeler: 'H777', hibccProduct: product };
    expect((await api(t, w.cookies.admin).post('/api/catalogue', body)).status).toBe(201);
    const again = await api(t, w.cookies.admin).post('/api/catalogue', { ...body, description: 'Snare copy' });
    expect(again.status).toBe(409);
    expect(again.body.issues).toEqual([{ path: 'hibccProduct', message: 'Already in the catalogue' }]);
    const other = await addItem(t, w);
    const edit = await api(t, w.cookies.admin).put(`/api/catalogue/${(other as { id: string }).id}`, { ...body, description: 'Edited into a copy' });
    expect(edit.status).toBe(409);
    expect(edit.body.issues).toEqual([{ path: 'hibccProduct', message: 'Already in the catalogue' }]);
  });

  it('answers items added at the same moment with one code with one 201 and 409s, never a 500 (a double submit)', async () => {
    const body = { description: 'Clip, double submit', type: 'clip', gtin: inventedGtin() };
    const answers = await Promise.all(Array.from({ length: 6 }, () => api(t, w.cookies.admin).post('/api/catalogue', body)));
    const statuses = answers.map((r) => r.status).sort();
    expect(statuses).toEqual([201, 409, 409, 409, 409, 409]);
  });

  it('an admin edits an item and takes it out of use; it leaves the list but stays readable on request', async () => {
    const item = await addItem(t, w);
    const edited = await api(t, w.cookies.admin).put(`/api/catalogue/${item.id}`, { description: 'Clip, 16 mm opening', type: 'clip', sizeLabel: '16 mm', gtin: item.gtin });
    expect(edited.status).toBe(200);
    expect(edited.body).toMatchObject({ description: 'Clip, 16 mm opening', sizeLabel: '16 mm' });
    const off = await api(t, w.cookies.admin).patch(`/api/catalogue/${item.id}`, { active: false });
    expect(off.body.active).toBe(false);
    const ids = async (q = '') => catalogueListSchema.parse((await api(t, w.cookies.nurse).get(`/api/catalogue${q}`)).body).items.map((i) => i.id);
    expect(await ids()).not.toContain(item.id);
    expect(await ids('?includeInactive=true')).toContain(item.id);
    const on = await api(t, w.cookies.admin).patch(`/api/catalogue/${item.id}`, { active: true });
    expect(on.body.active).toBe(true);
  });

  it('only an admin changes it: a nurse, an endoscopist and a supervisor get 403', async () => {
    const item = await addItem(t, w);
    for (const role of ['nurse', 'endoscopist', 'supervisor'] as const) {
      const add = await api(t, w.cookies[role]).post('/api/catalogue', { description: 'Clip', type: 'clip', gtin: inventedGtin() });
      expect(add.status).toBe(403);
      expect((await api(t, w.cookies[role]).patch(`/api/catalogue/${item.id}`, { active: false })).status).toBe(403);
    }
  });

  it('no unit sees or changes another unit\'s items', async () => {
    const item = await addItem(t, w);
    const theirs = catalogueListSchema.parse((await api(t, other.cookies.nurse).get('/api/catalogue?includeInactive=true')).body).items;
    expect(theirs.map((i) => i.id)).not.toContain(item.id);
    expect((await api(t, other.cookies.admin).patch(`/api/catalogue/${item.id}`, { active: false })).status).toBe(404);
    expect((await api(t, other.cookies.admin).put(`/api/catalogue/${item.id}`, { description: 'X', type: 'clip', gtin: item.gtin })).status).toBe(404);
  });

  it('answers 401 without a session and 400 for a malformed id or an unknown field', async () => {
    expect((await api(t).get('/api/catalogue')).status).toBe(401);
    const badId = await api(t, w.cookies.admin).patch('/api/catalogue/not-a-uuid', { active: false });
    expect(badId.status).toBe(400);
    expect(badId.body.issues[0].path).toBe('itemId');
    const extra = await api(t, w.cookies.admin).post('/api/catalogue', { description: 'Clip', type: 'clip', gtin: inventedGtin(), brand: 'x' });
    expect(extra.status).toBe(400);
    expect(extra.body.error).toMatch(/brand/);
  });
});
