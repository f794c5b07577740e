import { expect, login, test } from './fixtures.ts';
import { count, openCapture, rowIds, scheduleCase, serverEvents, serverRecord, tap, waitForState } from './capture-helpers.ts';

const nurse = 'sofia.marin@kestrelbay.example';

test('a nurse records a case through a network cut and a reload, and the server holds each tap once, in order', async ({ page, context }) => {
  await login(page, nurse);
  const caseId = await scheduleCase(page);
  await openCapture(page, caseId);
  // The reload offline is served by the service worker: wait until it controls the page.
  await page.evaluate(async () => { await navigator.serviceWorker.ready; });
  await page.reload();
  await waitForState(page, 'online');
  await expect.poll(() => page.evaluate(() => Boolean(navigator.serviceWorker.controller))).toBe(true);

  const tapped: string[] = [];
  const tapAndNote = async (key: string, kind: string) => { await tap(page, key); tapped.push(kind); };

  await tapAndNote('scope-in', 'scope_in');
  await tapAndNote('injection', 'injection');
  await tapAndNote('clip-deployed', 'clip_fired');
  // The server has those three before the network goes. (The strip is drawn a frame after a tap, so
  // its empty count alone could still be the one from before the last tap.)
  await expect.poll(async () => (await serverEvents(page.request, caseId)).length).toBe(3);
  await expect(page.getByTestId('waiting-count')).toHaveText('');

  await context.setOffline(true);
  await waitForState(page, 'offline');
  await tapAndNote('bleed', 'bleed');
  await tapAndNote('clip-deployed', 'clip_fired');
  await tapAndNote('haemostasis', 'haemostasis');
  await expect(count(page, 'clips-deployed')).toHaveText('2');
  await expect(page.getByTestId('waiting-count')).toHaveText('· 3 waiting');

  await page.reload();
  await page.getByTestId('capture-screen').waitFor();
  await waitForState(page, 'offline');
  // Nothing shown before the reload was lost: it was in IndexedDB.
  await expect(count(page, 'clips-deployed')).toHaveText('2');
  await expect(count(page, 'bleeds-controlled')).toHaveText('1');
  await tapAndNote('loop', 'loop_placed');
  await tapAndNote('clip-misfired', 'clip_fired');
  await expect(page.getByTestId('waiting-count')).toHaveText('· 5 waiting');
  const idsOnScreen = (await rowIds(page)).reverse();

  await context.setOffline(false);
  await waitForState(page, 'online', 30_000);
  await expect(page.getByTestId('waiting-count')).toHaveText('');

  const stored = await serverEvents(page.request, caseId);
  expect(stored.map((e) => e.kind)).toEqual(tapped);
  expect(stored.map((e) => e.id)).toEqual(idsOnScreen);
  expect(new Set(stored.map((e) => e.id)).size).toBe(tapped.length);
  expect(stored.map((e) => e.seq)).toEqual(tapped.map((_, i) => i + 1));

  const record = await serverRecord(page.request, caseId);
  await expect(count(page, 'clips-deployed')).toHaveText(String(record.counts.clipsDeployed));
  await expect(count(page, 'clips-misfired')).toHaveText(String(record.counts.clipsMisfired));
  await expect(count(page, 'loops-placed')).toHaveText(String(record.counts.loopsPlaced));
  await expect(count(page, 'bleeds-open')).toHaveText(String(record.counts.bleedsOpen));
  await expect(count(page, 'bleeds-controlled')).toHaveText(String(record.bleeds.filter((b) => b.controlledMs !== null).length));
  expect(record.counts).toMatchObject({ clipsDeployed: 2, clipsMisfired: 1, loopsPlaced: 1, bleedsOpen: 0 });
});
