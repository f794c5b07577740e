import type { Page } from '@playwright/test';
import { expect, login, test } from './fixtures.ts';
import { count, openCapture, scheduleCase, serverEvents, tap } from './capture-helpers.ts';

const sofia = 'sofia.marin@kestrelbay.example';
const daniel = 'daniel.kaur@kestrelbay.example';

/**
 * Sofia's tablet and Daniel's, both on the capture screen of a case scheduled for the test. Daniel's
 * opens the address with the case id in capitals (typed, or from a scanner): the same case.
 */
async function twoTabletsOnANewCase(page: Page, secondTablet: (email: string) => Promise<Page>) {
  await login(page, sofia);
  const caseId = await scheduleCase(page);
  await openCapture(page, caseId);
  const other = await secondTablet(daniel);
  await openCapture(other, caseId.toUpperCase());
  return { caseId, other };
}

test('two tablets on one case see each other\'s taps', async ({ page, secondTablet }) => {
  const { other } = await twoTabletsOnANewCase(page, secondTablet);

  await tap(page, 'clip-deployed');
  await expect(count(other, 'clips-deployed')).toHaveText('1');
  await tap(other, 'bleed');
  await expect(count(page, 'bleeds-open')).toHaveText('1');
  await expect(page.locator('[data-testid="recent-events"] > li')).toHaveCount(2);
  await expect(other.locator('[data-testid="recent-events"] > li')).toHaveCount(2);
  await expect(page.locator('[data-testid="recent-events"] > li[data-kind="bleed"]')).toContainText('Daniel Kaur');
});

test('undo voids the last tap, and only that one', async ({ page }) => {
  await login(page, sofia);
  const caseId = await scheduleCase(page);
  await openCapture(page, caseId);

  await tap(page, 'loop');
  await tap(page, 'clip-deployed');
  await expect(count(page, 'clips-deployed')).toHaveText('1');
  await page.getByRole('button', { name: /^Undo “Clip deployed”/ }).tap();
  await expect(count(page, 'clips-deployed')).toHaveText('0');
  await expect(count(page, 'loops-placed')).toHaveText('1');

  await expect.poll(async () => (await serverEvents(page.request, caseId)).length).toBe(3);
  const [loop, clip, voided] = await serverEvents(page.request, caseId);
  expect([loop!.kind, clip!.kind, voided!.kind]).toEqual(['loop_placed', 'clip_fired', 'void']);
  expect(voided!.payload).toEqual({ targetId: clip!.id, reason: 'undo' });
  await expect(page.locator(`[data-event-id="${clip!.id}"]`)).toHaveAttribute('data-voided', 'true');
  await expect(page.locator(`[data-event-id="${loop!.id}"]`)).not.toHaveAttribute('data-voided');
});

test('a second tablet\'s near-duplicate tap is shown for a person to resolve', async ({ page, secondTablet }) => {
  const { caseId, other } = await twoTabletsOnANewCase(page, secondTablet);

  await tap(page, 'clip-deployed');
  await tap(other, 'clip-deployed');
  const notice = page.getByTestId('near-duplicate');
  await expect(notice).toContainText('“Clip deployed” was recorded on two tablets');
  await expect(other.getByTestId('near-duplicate')).toBeVisible();
  // Nothing merged on its own: both count until a person decides.
  await expect(count(page, 'clips-deployed')).toHaveText('2');

  await notice.getByRole('button', { name: /^Same: void the one from Daniel Kaur/ }).tap();
  await expect(notice).toHaveCount(0);
  await expect(other.getByTestId('near-duplicate')).toHaveCount(0);
  await expect(count(other, 'clips-deployed')).toHaveText('1');
  const events = await serverEvents(page.request, caseId);
  const danielsClip = events.find((e) => e.kind === 'clip_fired' && e.author !== events[0]!.author);
  expect(events.at(-1)).toMatchObject({ kind: 'void', payload: { targetId: danielsClip!.id, reason: 'Same event recorded on two tablets' } });
});
