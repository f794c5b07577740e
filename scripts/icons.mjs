// Renders the Ledgerline mark (public/favicon.svg) to the PNG icons the web app manifest names.
// Run by hand after changing the mark: `node scripts/icons.mjs`; the PNGs are committed.
// The mark: a ruled ledger line with three ticks, and one filled marker on it — a moment recorded.
import { writeFile } from 'node:fs/promises';
import { chromium } from '@playwright/test';

const ink = '#16324f';
const paper = '#f7f3ea';
const marker = '#e0a526';

/** @param {{ bleed: boolean }} o bleed: fill the whole square (maskable icons are cropped to a circle). */
function mark({ bleed }) {
  const scale = bleed ? 0.72 : 1; // maskable: keep the drawing inside the 80% safe zone
  const t = (512 - 512 * scale) / 2;
  const bg = bleed
    ? `<rect width="512" height="512" fill="${ink}"/>`
    : `<rect x="16" y="16" width="480" height="480" rx="112" fill="${ink}"/>`;
  return `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 512 512" width="512" height="512">
  ${bg}
  <g transform="translate(${t} ${t}) scale(${scale})">
    <rect x="96" y="150" width="320" height="22" rx="11" fill="${paper}" opacity="0.45"/>
    <rect x="96" y="245" width="320" height="22" rx="11" fill="${paper}"/>
    <rect x="126" y="215" width="16" height="82" rx="8" fill="${paper}"/>
    <rect x="248" y="215" width="16" height="82" rx="8" fill="${paper}"/>
    <rect x="370" y="215" width="16" height="82" rx="8" fill="${paper}"/>
    <circle cx="318" cy="256" r="44" fill="${marker}" stroke="${ink}" stroke-width="14"/>
    <rect x="96" y="340" width="200" height="22" rx="11" fill="${paper}" opacity="0.45"/>
  </g>
</svg>`;
}

const outputs = [
  { file: 'public/pwa-192.png', size: 192, bleed: false },
  { file: 'public/pwa-512.png', size: 512, bleed: false },
  { file: 'public/pwa-maskable-512.png', size: 512, bleed: true },
  { file: 'public/apple-touch-icon.png', size: 180, bleed: true },
];

await writeFile('public/favicon.svg', mark({ bleed: false }));
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--headless', '--no-sandbox', '--disable-gpu'] });
try {
  for (const o of outputs) {
    const page = await browser.newPage({ viewport: { width: o.size, height: o.size } });
    const svg = mark({ bleed: o.bleed }).replace('width="512" height="512"', `width="${o.size}" height="${o.size}"`);
    await page.setContent(`<html><body style="margin:0;background:transparent">${svg}</body></html>`);
    await page.screenshot({ path: o.file, omitBackground: true, clip: { x: 0, y: 0, width: o.size, height: o.size } });
    await page.close();
    console.log('wrote', o.file);
  }
} finally {
  await browser.close();
}
