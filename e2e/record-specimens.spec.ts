import { expect, login, test } from './fixtures.ts';
import { openCapture, scheduleCase, serverEvents } from './capture-helpers.ts';

/**
 * A specimen from the room to its label: the nurse taps "Specimen out" on the capture screen, then on
 * the specimens page lists that very specimen with one button. The record holds one specimen, with the
 * tap's time and the list's label, not a tapped row beside a listed one.
 */
const sofia = 'sofia.marin@kestrelbay.example';

test('a specimen tapped out in the room is listed as that specimen, with the time it came out', async ({ page }) => {
  await login(page, sofia);
  const caseId = await scheduleCase(page);
  await openCapture(page, caseId);
  const pad = page.getByRole('group', { name: 'Record an event' });
  await pad.getByRole('button', { name: 'Specimen out', exact: true }).tap();
  await expect.poll(async () => (await serverEvents(page.request, caseId)).length, { timeout: 15_000 }).toBe(1);
  const [tap] = await serverEvents(page.request, caseId);
  const specimenId = (tap!.payload as { specimenId?: string }).specimenId;
  expect(specimenId).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-7[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/); // UUIDv7 (RFC 9562 §5.7)

  await page.goto(`/cases/${caseId}/specimens`);
  const tapped = page.getByRole('region', { name: 'Tapped in the room, not listed' });
  await expect(tapped.getByRole('listitem')).toHaveCount(1);
  await tapped.getByRole('button', { name: 'List it as specimen A' }).click();
  await expect(page.getByRole('listitem', { name: 'Specimen A' })).toBeVisible();
  await expect(tapped).toHaveCount(0);
  // The suggested label of the form moved on with the list.
  await expect(page.getByRole('form', { name: 'List a specimen' }).getByLabel('Label')).toHaveValue('B');

  const specimens = await (await page.request.get(`/api/cases/${caseId}/specimens`)).json();
  expect(specimens.specimens.map((s: { id: string; label: string }) => [s.id, s.label])).toEqual([[specimenId, 'A']]);
  await page.goto(`/cases/${caseId}/record`);
  const table = page.getByRole('table', { name: 'Specimens' });
  const rows = table.getByRole('row');
  await expect(rows).toHaveCount(2); // the head and one specimen
  await expect(rows.nth(1).getByRole('cell').first()).toHaveText('A');
  await expect(rows.nth(1).getByRole('cell').nth(1)).not.toHaveText('—');
});
