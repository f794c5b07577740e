import { execFileSync } from 'node:child_process';
import { expect, login, test } from './fixtures.ts';
import { openCapture, scheduleCase, serverEvents } from './capture-helpers.ts';

/**
 * From the room to the chart: a nurse scans a clip's label (typed, as a keyboard-wedge scanner types it),
 * fires clips with one misfire, places a loop, records a bleed and its haemostasis on the capture screen,
 * then finds the counts, the lot and the bleed episode on the record page and in the PDF.
 */
const sofia = 'sofia.marin@kestrelbay.example';
// The demo catalogue's 11 mm clip (server/db/seed/demo-data.ts, invented GTIN with a valid GS1 check digit).
const CLIP_GTIN = '00200044710075';

test('a scanned clip, a misfire, a loop and a bleed reach the record page and the PDF', async ({ page }) => {
  await login(page, sofia);
  const caseId = await scheduleCase(page);
  const lot = `E2E${Math.random().toString(36).slice(2, 7).toUpperCase()}`;
  await openCapture(page, caseId);
  const pad = page.getByRole('group', { name: 'Record an event' });
  const press = (name: string) => pad.getByRole('button', { name, exact: true }).tap();

  await press('Scope in');
  await press('Clip deployed');
  // The quick strip shows after the tap (the tap is already recorded); "More…" opens the whole sheet,
  // whose item field is the scan field.
  await page.getByRole('button', { name: 'More…' }).click();
  const sheet = page.getByTestId('detail-panel');
  const field = sheet.getByLabel('Device label (scan or type)');
  // AI (01) GTIN, (17) expiry 31 Dec 2039, (10) lot, then <GS> before (21) serial (GS1 General Specifications §7.8.5).
  await field.fill(`01${CLIP_GTIN}17391231` + `10${lot}<GS>21SN1`);
  await field.press('Enter');
  const reading = sheet.getByTestId('scan-reading');
  await expect(reading).toContainText('Through-the-scope clip, 11 mm jaw');
  await expect(reading).toContainText(lot);
  await expect(reading).toContainText('2039-12-31');
  await reading.getByRole('button', { name: 'Record this device' }).click();
  await expect(sheet.getByRole('status')).toContainText(`Label recorded: lot ${lot}`);
  await sheet.getByRole('button', { name: 'Save details' }).click();

  await press('Clip misfired');
  await press('Clip deployed');
  await press('Loop placed');
  await press('Bleed');
  await press('Haemostasis achieved');
  await press('Scope out');

  // 7 taps, and the amendment naming the clip item.
  await expect.poll(async () => (await serverEvents(page.request, caseId)).length, { timeout: 15_000 }).toBe(9);

  await page.goto(`/cases/${caseId}/record`);
  await expect(page.getByTestId('count-clips-deployed')).toHaveText('2');
  await expect(page.getByTestId('count-clips-misfired')).toHaveText('1');
  await expect(page.getByTestId('count-loops')).toHaveText('1');
  await expect(page.getByTestId('device-lots')).toContainText(`${lot} (2039-12-31)`);
  // The label was read in the sheet of the first "Clip deployed" tap, so its row names that tap.
  const labels = page.getByRole('table', { name: 'Device labels read' });
  const labelRow = labels.getByRole('row').filter({ hasText: lot });
  await expect(labelRow).toHaveCount(1);
  await expect(labelRow.getByRole('cell').last()).toHaveText('Clip deployed');
  await expect(labels).not.toContainText('not linked to a tap');
  const bleeds = page.getByRole('region', { name: 'Bleed episodes' });
  await expect(bleeds.getByRole('row')).toHaveCount(2);
  await expect(bleeds.getByTestId('bleed-time')).not.toHaveText('—');
  const pdfLink = page.getByRole('link', { name: 'Open the PDF' });
  await expect(pdfLink).toHaveAttribute('href', `/api/cases/${caseId}/record.pdf`);

  // The PDF's text read back with Poppler's pdftotext (poppler-utils), as a reader shows it.
  const res = await page.request.get(`/api/cases/${caseId}/record.pdf`);
  expect(res.headers()['content-type']).toBe('application/pdf');
  const text = execFileSync('pdftotext', ['-layout', '-enc', 'UTF-8', '-', '-'], { input: await res.body() }).toString('utf8').replace(/[ \t]+/g, ' ');
  expect(text).toMatch(/Clips deployed 2\b/);
  expect(text).toMatch(/Clips misfired 1\b/);
  expect(text).toMatch(/Loops placed 1\b/);
  expect(text).toContain(`${lot} (2039-12-31)`);
  // The bleed row: its number, then the page's own time to haemostasis (pdftotext may drop the space in "0 s").
  const bleedTime = (await bleeds.getByTestId('bleed-time').textContent())!.trim();
  const bleedRow = text.split('\n').find((l) => /^1 \d\d:\d\d:\d\d /.test(l.trim()));
  expect(bleedRow?.replace(/\s/g, '')).toContain(bleedTime.replace(/\s/g, ''));
});
