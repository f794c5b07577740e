import request from 'supertest';
import { v7 as uuidv7 } from 'uuid';
import { gs1CheckDigit } from '#shared/domain/identifiers/index.ts';
import type { EventKind, PayloadOf } from '#shared/schemas/events.ts';
import { buildEvent } from '../factories/events.ts';
import { asBrowser, buildCase, buildTeam, signIn, tag, type TestMember, type TestUnit } from './factories.ts';
import type { TestContext } from './helpers/app.ts';

/**
 * Shared set-up of the record, catalogue, device and specimen tests: a unit with its team signed in, a
 * case, and helpers that speak to the API as a browser would. Every name is invented.
 */
export interface Ward {
  unit: TestUnit;
  members: Record<'nurse' | 'endoscopist' | 'supervisor' | 'admin', TestMember>;
  cookies: Record<'nurse' | 'endoscopist' | 'supervisor' | 'admin', string>;
}

export async function buildWard(t: TestContext): Promise<Ward> {
  const { unit, members } = await buildTeam(t);
  const [nurse, endoscopist, supervisor, admin] = await Promise.all([
    signIn(t, members.nurse), signIn(t, members.endoscopist), signIn(t, members.supervisor), signIn(t, members.admin),
  ]);
  return { unit, members, cookies: { nurse, endoscopist, supervisor, admin } };
}

export const caseFor = (t: TestContext, w: Ward, over: Parameters<typeof buildCase>[3] = {}) => buildCase(t, w.unit, w.members, over);

export const api = (t: TestContext, cookie?: string) => ({
  get: (path: string) => request(t.app).get(path).set(asBrowser(cookie)),
  post: (path: string, body: unknown) => request(t.app).post(path).set(asBrowser(cookie)).send(body as object),
  put: (path: string, body: unknown) => request(t.app).put(path).set(asBrowser(cookie)).send(body as object),
  patch: (path: string, body: unknown) => request(t.app).patch(path).set(asBrowser(cookie)).send(body as object),
});

/** A binary answer (PDF, PNG) as a Buffer. */
export const binary = (t: TestContext, cookie: string, path: string) =>
  request(t.app).get(path).set(asBrowser(cookie)).buffer(true).parse((res, done) => {
    const chunks: Buffer[] = [];
    res.on('data', (c: Buffer) => chunks.push(c));
    res.on('end', () => done(null, Buffer.concat(chunks)));
  });

/** A valid GTIN-14 for invented test items: 13 data digits and the GS1 check digit (GS1 General Specifications §7.9.1). */
export function inventedGtin(): string {
  const body = `0${String(Math.floor(Math.random() * 1e12)).padStart(12, '0')}`;
  return `${body}${gs1CheckDigit(body)}`;
}

/** Adds a catalogue item as the unit's admin; answers the stored item. */
export async function addItem(t: TestContext, w: Ward, over: Record<string, unknown> = {}) {
  const res = await api(t, w.cookies.admin).post('/api/catalogue', {
    description: `Through-the-scope clip ${tag()}`, type: 'clip', sizeLabel: '11 mm', gtin: inventedGtin(), ...over,
  });
  if (res.status !== 201) throw new Error(`catalogue item not created: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body as { id: string; gtin: string | null; description: string };
}

/** A tap of `kind` at minute `minute` of a case starting at `base`, by `author`. */
export function tap<K extends EventKind>(caseId: string, author: string, kind: K, minute: number, payload?: PayloadOf<K>, base = Date.parse('2025-03-14T09:00:00.000Z')) {
  return buildEvent(kind, {
    caseId, author, device: 'tablet-room-1', deviceTime: new Date(base + minute * 60_000).toISOString(),
    ...(payload ? { payload } : {}),
  } as never);
}

/** Pushes events over REST as `cookie`; every one must be accepted. */
export async function record(t: TestContext, cookie: string, caseId: string, events: { id: string }[]): Promise<void> {
  const res = await api(t, cookie).post(`/api/cases/${caseId}/events`, { events });
  if (res.status !== 200) throw new Error(`events not stored: ${res.status} ${JSON.stringify(res.body)}`);
  const refused = (res.body.results as { status: string; reason?: string }[]).filter((r) => r.status === 'refused');
  if (refused.length) throw new Error(`events refused: ${JSON.stringify(refused)}`);
}

export const newId = () => uuidv7();

/**
 * An invented ESD with everything the record shows: a time-out, a bleed stopped with a clip after a
 * misfire, a closure clip whose item and lot come from a scan attached after the tap, a loop, a voided
 * clip with its scan, a listed specimen measured after its tap, and a sign-out. Minutes from 09:00 UTC.
 */
export async function recordScenario(t: TestContext, w: Ward) {
  const c = await caseFor(t, w, { procedureType: 'esd', status: 'recording' });
  const clipItem = await addItem(t, w, { description: `Rotatable clip ${tag()}`, sizeLabel: '11 mm' });
  const loopItem = await addItem(t, w, { description: `Detachable loop ${tag()}`, type: 'loop', sizeLabel: '20 mm' });
  const specimenId = newId();
  const n = w.members.nurse.id;
  const e = <K extends EventKind>(kind: K, minute: number, payload?: PayloadOf<K>, author = n) => tap(c.id, author, kind, minute, payload);
  const bleed = e('bleed', 20, { severity: 'spurting', vesselMm: 2 });
  const closureClip = e('clip_fired', 50, { outcome: 'deployed', purpose: 'closure' });
  const voidedClip = e('clip_fired', 51, { outcome: 'deployed', purpose: 'closure', itemId: clipItem.id });
  const events = [
    e('patient_in', 0), e('time_out', 2, { items: [{ key: 'identity', label: 'Patient identity, two identifiers', answer: 'yes' }, { key: 'anticoagulants', label: 'Anticoagulants held', answer: 'no', note: 'Invented: aspirin continued' }] }),
    e('sedation_start', 3, { type: 'deep' }), e('scope_in', 5), e('marking', 8), e('injection', 10, { volumeMl: 5, agent: 'Saline' }),
    e('incision', 12), e('dissection', 15), bleed,
    e('clip_fired', 22, { outcome: 'deployed', purpose: 'haemostasis', itemId: clipItem.id }),
    e('clip_fired', 23, { outcome: 'misfired', itemId: clipItem.id }),
    e('haemostasis', 24.5, { achieved: true, method: 'clip', bleedId: bleed.id }),
    e('remark', 30, { text: 'Invented remark by the endoscopist' }, w.members.endoscopist.id),
    e('resection_complete', 40, { enBloc: true }), e('specimen_retrieved', 45, { method: 'net', specimenId }),
    closureClip, voidedClip, e('void', 51.5, { targetId: voidedClip.id, reason: 'Recorded twice' }),
    e('loop_placed', 52, { sizeMm: 20, itemId: loopItem.id }), e('closure_complete', 55, { complete: 'full' }),
    e('scope_out', 60),
  ];
  await record(t, w.cookies.nurse, c.id, events);
  const nurse = api(t, w.cookies.nurse);
  const u1 = await nurse.post(`/api/cases/${c.id}/device-usages`, { eventId: closureClip.id, rawScan: `01${clipItem.gtin}17391231${'10'}CLIPLOT-7` });
  const u2 = await nurse.post(`/api/cases/${c.id}/device-usages`, { eventId: voidedClip.id, rawScan: `01${clipItem.gtin}10VOIDLOT` });
  const s = await nurse.post(`/api/cases/${c.id}/specimens`, { id: specimenId, label: 'A', longMm: 30, shortMm: 20, pieces: 1, containerId: 'POT-1' });
  for (const r of [u1, u2, s]) if (r.status !== 201) throw new Error(`scenario set-up failed: ${r.status} ${JSON.stringify(r.body)}`);
  // The sign-out closes the record: devices and specimens are entered before it.
  await record(t, w.cookies.nurse, c.id, [e('sign_out', 62, { items: [{ key: 'counts', label: 'Device counts reconciled', answer: 'yes' }] })]);
  return { caseRow: c, clipItem, loopItem, specimenId, bleed, closureClip, voidedClip };
}
