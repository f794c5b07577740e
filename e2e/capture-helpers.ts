import type { APIRequestContext, Page } from '@playwright/test';
import { buildRecord, toRecordInput } from '../shared/domain/record/index.ts';
import type { StoredEvent } from '../shared/schemas/events.ts';
import type { Member, Room, ScheduleCaseInput } from '../shared/schemas/cases.ts';
import { origin } from './fixtures.ts';

/**
 * Helpers of the capture browser tests: each test schedules its own case through the API, so no two
 * tests share a case; the patient is invented and new for every case.
 */
async function json<T>(request: APIRequestContext, path: string): Promise<T> {
  const res = await request.get(path);
  if (!res.ok()) throw new Error(`GET ${path} answered ${res.status()}: ${await res.text()}`);
  return (await res.json()) as T;
}

/** Schedule a case in the signed-in user's unit for now (POST /api/cases) and return its id. */
export async function scheduleCase(page: Page): Promise<string> {
  const [rooms, members] = await Promise.all([json<Room[]>(page.request, '/api/rooms'), json<Member[]>(page.request, '/api/members')]);
  const nurse = members.find((m) => m.role === 'nurse');
  const endoscopist = members.find((m) => m.role === 'endoscopist');
  if (!rooms[0] || !nurse || !endoscopist) throw new Error('The demo unit needs a room, a nurse and an endoscopist');
  const tag = Math.random().toString(36).slice(2, 8).toUpperCase();
  const input: ScheduleCaseInput = {
    patient: { hospitalNumber: `E2E-${tag}`, familyName: `Testcase${tag}`, givenName: 'Robin', birthDate: '1958-04-11', sex: 'unknown' },
    procedureType: 'esd',
    indication: 'Invented case for a browser test',
    lesion: { site: 'gastric antrum', sizeMm: 25, paris: '0-IIa' },
    roomId: rooms[0].id,
    scheduledAt: new Date().toISOString(),
    sedation: 'deep',
    endoscopistId: endoscopist.userId,
    nurseId: nurse.userId,
  };
  const res = await page.request.post('/api/cases', { data: input, headers: { origin } });
  if (res.status() !== 201) throw new Error(`POST /api/cases answered ${res.status()}: ${await res.text()}`);
  return ((await res.json()) as { id: string }).id;
}

/** Every event the server holds for a case, by sequence (GET /api/cases/:id/events, all pages). */
export async function serverEvents(request: APIRequestContext, caseId: string): Promise<StoredEvent[]> {
  const all: StoredEvent[] = [];
  for (let after = 0; ;) {
    const page = await json<{ events: StoredEvent[]; hasMore: boolean }>(request, `/api/cases/${caseId}/events?after=${after}`);
    all.push(...page.events);
    if (!page.hasMore || page.events.length === 0) return all;
    after = page.events.at(-1)!.seq;
  }
}

/** The record of truth of a case: the shared reducer over the server's events. */
export async function serverRecord(request: APIRequestContext, caseId: string) {
  return buildRecord((await serverEvents(request, caseId)).map(toRecordInput));
}

/** Open the capture screen of a case and wait until it is connected. */
export async function openCapture(page: Page, caseId: string): Promise<void> {
  await page.goto(`/cases/${caseId}/capture`);
  await page.getByTestId('capture-screen').waitFor();
  await waitForState(page, 'online');
}

export async function waitForState(page: Page, state: 'online' | 'offline' | 'syncing', timeout = 15_000): Promise<void> {
  await page.locator(`[data-testid="connection"][data-state="${state}"]`).waitFor({ timeout });
}

/** A finger tap on a pad button (touch input: the context has touch). */
export async function tap(page: Page, key: string): Promise<void> {
  await page.locator(`[data-tap="${key}"]`).tap();
}

export const count = (page: Page, id: string) => page.getByTestId(`count-${id}`);

/** The ids of the recent-list rows on screen, newest first. */
export const rowIds = (page: Page) => page.locator('[data-testid="recent-events"] > li').evaluateAll((els) => els.map((e) => e.getAttribute('data-event-id')));
