import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import bwipjs from 'bwip-js/node';
import { chromium, type Browser, type Page } from '@playwright/test';
import config from '../playwright.config.ts';
import { expect, login, origin, test } from './fixtures.ts';
import { openCapture, scheduleCase } from './capture-helpers.ts';

/**
 * The camera path of the scan field, end to end: Chromium's fake camera plays a still frame of a GS1
 * DataMatrix (made with bwip-js), and the screen reads it with ZXing in its worker, as on a tablet whose
 * browser has no BarcodeDetector (headless Chromium on Linux has none).
 */
const sofia = 'sofia.marin@kestrelbay.example';
// The demo catalogue's 11 mm clip (server/db/seed/demo-data.ts, invented GTIN with a valid GS1 check digit).
const CLIP_GTIN = '00200044710075';
const [WIDTH, HEIGHT] = [640, 480];

/**
 * One frame of YUV4MPEG2 (4:2:0, the format Chromium's file camera plays): the luma of the code drawn
 * centred on white, decoded by the page's own canvas; the chroma neutral (grey).
 */
async function y4mOf(page: Page, png: Buffer): Promise<Buffer> {
  const luma = await page.evaluate(async ({ data, width, height }) => {
    const image = new Image();
    image.src = `data:image/png;base64,${data}`;
    await image.decode();
    const canvas = document.createElement('canvas');
    canvas.width = width;
    canvas.height = height;
    const g = canvas.getContext('2d')!;
    g.fillStyle = '#fff';
    g.fillRect(0, 0, width, height);
    g.imageSmoothingEnabled = false;
    g.drawImage(image, Math.round((width - image.width) / 2), Math.round((height - image.height) / 2));
    const { data: rgba } = g.getImageData(0, 0, width, height);
    const y = new Uint8Array(width * height);
    // ITU-R BT.601 luma, in the studio range Y4M's 4:2:0 expects (16–235).
    for (let i = 0; i < y.length; i++) y[i] = Math.round(16 + (65.481 * rgba[4 * i]! + 128.553 * rgba[4 * i + 1]! + 24.966 * rgba[4 * i + 2]!) / 255);
    return Array.from(y);
  }, { data: png.toString('base64'), width: WIDTH, height: HEIGHT });
  const chroma = Buffer.alloc((WIDTH / 2) * (HEIGHT / 2) * 2, 128);
  return Buffer.concat([Buffer.from(`YUV4MPEG2 W${WIDTH} H${HEIGHT} F10:1 Ip A1:1 C420jpeg\nFRAME\n`), Buffer.from(luma), chroma]);
}

test('a clip label held to the camera is read, with its lot and expiry, before it is recorded', async ({ page }) => {
  const lot = `CAM${Math.random().toString(36).slice(2, 7).toUpperCase()}`;
  // AI (01) GTIN, (17) expiry, (10) lot, (21) serial: the bracketed form bwip-js encodes with FNC1s.
  const png = await bwipjs.toBuffer({ bcid: 'gs1datamatrix', text: `(01)${CLIP_GTIN}(17)391231(10)${lot}(21)SN7`, scale: 6, paddingwidth: 4, paddingheight: 4 });
  const dir = mkdtempSync(join(tmpdir(), 'ledgerline-camera-'));
  const video = join(dir, 'label.y4m');
  writeFileSync(video, await y4mOf(page, png));

  let browser: Browser | null = null;
  try {
    browser = await chromium.launch({
      executablePath: config.use?.launchOptions?.executablePath,
      args: [...(config.use?.launchOptions?.args ?? []), '--use-fake-device-for-media-stream', `--use-file-for-fake-video-capture=${video}`],
    });
    const context = await browser.newContext({ baseURL: origin, viewport: config.use?.viewport ?? undefined, hasTouch: true, permissions: ['camera'] });
    const tablet = await context.newPage();
    await login(tablet, sofia);
    const caseId = await scheduleCase(tablet);
    await openCapture(tablet, caseId);
    // The path tested is ZXing's: this browser has no BarcodeDetector.
    expect(await tablet.evaluate(() => 'BarcodeDetector' in window)).toBe(false);
    const pad = tablet.getByRole('group', { name: 'Record an event' });
    await pad.getByRole('button', { name: 'Clip deployed', exact: true }).tap();
    await tablet.getByRole('button', { name: 'More…' }).click();
    const sheet = tablet.getByTestId('detail-panel');
    await sheet.getByRole('button', { name: 'Use the camera' }).click();
    const reading = sheet.getByTestId('scan-reading');
    await expect(reading).toContainText('Through-the-scope clip, 11 mm jaw', { timeout: 15_000 });
    await expect(reading).toContainText(lot);
    await expect(reading).toContainText('2039-12-31');
    // The camera stops once a code is read; the reading is recorded like a typed one.
    await expect(sheet.getByRole('button', { name: 'Stop the camera' })).toHaveCount(0);
    await reading.getByRole('button', { name: 'Record this device' }).click();
    await expect(sheet.getByRole('status')).toContainText(`Label recorded: lot ${lot}`);
  } finally {
    await browser?.close();
    rmSync(dir, { recursive: true, force: true });
  }
});
