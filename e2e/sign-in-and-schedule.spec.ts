import { format } from 'date-fns';
import type { Page } from '@playwright/test';
import { demoUser, expect, test } from './fixtures.ts';

// A demo nurse of the invented unit (server/db/seed/demo-users.json, read by the fixture).
const nurse = demoUser('sofia.marin@kestrelbay.example');

/** Through the sign-in form itself, as a person does (the `login` fixture goes through the API). */
async function signInWithForm(page: Page, next = '/cases') {
  await page.goto(next);
  await expect(page).toHaveURL(new RegExp(`/sign-in\\?next=${encodeURIComponent(next)}$`));
  await page.getByLabel('E-mail address').fill(nurse.email);
  await page.getByLabel('Password').fill(nurse.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page).toHaveURL(new RegExp(`${next}$`));
  await expect(page.getByTestId('signed-in-user')).toContainText(nurse.name);
}

test('a nurse signs in, sees today’s cases, schedules a case after fixing a field, and lands on it', async ({ page }) => {
  await signInWithForm(page);

  // Today's list, every room shown; the seed books a case in Room A this morning (server/db/seed/demo-data.ts).
  await expect(page.getByRole('heading', { level: 1 })).toContainText('Today');
  const roomA = page.getByRole('region', { name: /^Room A/ });
  await expect(roomA).toContainText('MOREAU, Henri');
  await expect(page.getByRole('region', { name: /^Room B/ })).toBeVisible();
  await expect(page.getByRole('region', { name: /^Room C/ })).toBeVisible();

  await page.getByRole('link', { name: /Schedule a case/ }).click();
  await expect(page.getByRole('heading', { level: 1 })).toHaveText('Schedule a case');

  // Invented patient; a fresh hospital number per run, so re-runs on one database never collide.
  const hospitalNumber = `E2E-${Date.now()}`;
  await page.getByLabel('Hospital number').fill(hospitalNumber);
  await page.getByLabel('Family name').fill('Quillfeather');
  await page.getByLabel('Given name').fill('Rowan');
  await page.getByLabel('Date of birth').fill('1966-08-21');
  await page.getByRole('combobox', { name: /^Sex/ }).selectOption('female');
  await page.getByRole('combobox', { name: /^Procedure/ }).selectOption('emr');
  await page.getByLabel('Indication').fill('Invented indication for a browser test');
  await page.getByLabel('Lesion site').fill('transverse colon');
  await page.getByLabel('Size (mm)').fill('0');
  await page.getByRole('combobox', { name: /^Paris type/ }).selectOption('0-Is');
  await page.getByRole('combobox', { name: /^Room/ }).selectOption({ label: 'Room C' });
  await page.getByLabel('Planned start').fill(`${format(new Date(), 'yyyy-MM-dd')}T16:45`);
  await page.getByRole('combobox', { name: /^Sedation/ }).selectOption('moderate');
  await page.getByRole('combobox', { name: /^Endoscopist/ }).selectOption({ label: 'Dr Lucas Brandt' });
  await page.getByRole('combobox', { name: /^Assisting nurse/ }).selectOption({ label: nurse.name });

  // A size of 0 is refused on the tablet with the shared schema's words (shared/schemas/cases.ts), and nothing is sent.
  const posts: string[] = [];
  page.on('request', (r) => { if (r.method() === 'POST' && new URL(r.url()).pathname === '/api/cases') posts.push(r.url()); });
  await page.getByRole('button', { name: 'Schedule the case' }).click();
  await expect(page.getByText('At least 1 mm')).toBeVisible();
  await expect(page.getByLabel('Size (mm)')).toHaveAttribute('aria-invalid', 'true');
  expect(posts).toEqual([]);

  await page.getByLabel('Size (mm)').fill('22');
  await expect(page.getByText('At least 1 mm')).toHaveCount(0);
  await page.getByRole('button', { name: 'Schedule the case' }).click();

  await expect(page).toHaveURL(/\/cases\/[0-9a-f-]{36}$/);
  const patient = page.getByRole('region', { name: 'Patient' });
  await expect(patient).toContainText('QUILLFEATHER, Rowan');
  await expect(patient).toContainText(hospitalNumber);
  await expect(patient).toContainText('21 Aug 1966');
  await expect(page.getByText('Booked')).toBeVisible();
  await expect(page.getByText('transverse colon')).toBeVisible();
  await expect(page.getByRole('note', { name: 'Caution' })).toContainText('it gives no clinical advice');
  await expect(page.getByRole('link', { name: /Open the recorder/ })).toHaveAttribute('href', /\/capture$/);
  expect(posts).toHaveLength(1);
});

test('after one visit the shell loads with no network and shows who is signed in', async ({ page, context }) => {
  await signInWithForm(page);
  // Wait until the service worker controls the page, then load once more so the API answers pass through it.
  await page.waitForFunction(() => navigator.serviceWorker.controller !== null, undefined, { timeout: 15_000 });
  await page.reload();
  await expect(page.getByRole('region', { name: /^Room A/ })).toContainText('MOREAU, Henri');

  await context.setOffline(true);
  try {
    await page.reload();
    await expect(page.getByTestId('signed-in-user')).toContainText(nurse.name);
    await expect(page.getByText(/^Offline/)).toBeVisible();
    await expect(page.getByRole('heading', { level: 1 })).toContainText('Today');
    await expect(page.getByRole('region', { name: /^Room A/ })).toContainText('MOREAU, Henri');
  } finally {
    await context.setOffline(false);
  }
});
