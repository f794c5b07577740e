// The app's figures on the real capture screen, each measured in turns with its floor on the bare page
// (public/bench/frame-floor.html): tap the floor, tap the app, tap the floor, … so both see the same
// moment of this machine (other work on it shifts both alike, not one of them).
import { join } from 'node:path';
import { centreOf, installPaintProbe, installWatchProbe, touchTap } from './probe.mjs';
import { openScreenFloor } from './screen-floor.mjs';
import { waitInPage } from './series.mjs';
import { jitter } from './stats.mjs';
import { tabletContext } from './browser.mjs';

const COUNTER = '[data-testid="count-clips-deployed"]';
const LIST = '[data-testid="recent-events"]';
const ROW = `${LIST} > li`;
const BUTTON = '[data-tap="clip-deployed"]';

/** Open the capture screen and wait until it is connected and its newest row is event `newestId`. */
async function openCapture(context, caseId, newestId) {
  const page = await context.newPage();
  await page.goto(`/cases/${caseId}/capture`);
  await page.locator('[data-testid="connection"][data-state="online"]').waitFor({ timeout: 30_000 });
  // The newest event is in (the catch-up read brings every page of the log), so the record is built over all.
  await page.locator(ROW).first().and(page.locator(`[data-event-id="${newestId}"]`)).waitFor({ timeout: 30_000 });
  return page;
}

export async function measurePaired(browser, { origin, root, caseId, newestId, taps, warmup = 5, emailA, emailB }) {
  // bypassCSP on the bare page only, so that the bare socket.io client can be added to it inline.
  const floorCtx = await tabletContext(browser, { origin, root, email: emailA, bypassCSP: true });
  const a = await tabletContext(browser, { origin, root, email: emailA });
  const b = await tabletContext(browser, { origin, root, email: emailA === emailB ? emailA : emailB });
  const screenCtx = await tabletContext(browser, { origin, root, email: null });
  try {
    const floor = await floorCtx.newPage();
    await floor.goto('/bench/frame-floor.html');
    await floor.evaluate(installPaintProbe, { target: '#tap', counter: '#count', row: null });
    await floor.addScriptTag({ path: join(root, 'node_modules', 'socket.io-client', 'dist', 'socket.io.min.js') });
    await floor.evaluate(() => window.benchRttConnect());
    const cdpF = await floorCtx.newCDPSession(floor);
    const tapAt = await floor.evaluate(centreOf, '#tap');
    const putAt = await floor.evaluate(centreOf, '#put');

    const pageA = await openCapture(a, caseId, newestId);
    const cdpA = await a.newCDPSession(pageA);
    await pageA.evaluate(installPaintProbe, { target: BUTTON, counter: COUNTER, row: ROW });
    await pageA.evaluate(() => performance.clearMarks('sync:tap-durable'));
    const buttonAt = await pageA.evaluate(centreOf, BUTTON);

    // The same screen as a static copy with a bare handler (screen-floor.mjs), opened before any tap.
    const screen = await openScreenFloor(screenCtx, pageA, { button: BUTTON, counter: COUNTER, list: LIST });
    await screen.evaluate(installPaintProbe, { target: BUTTON, counter: COUNTER, row: ROW });
    const cdpS = await screenCtx.newCDPSession(screen);
    const screenAt = await screen.evaluate(centreOf, BUTTON);

    const floorTap = async (k) => { await touchTap(cdpF, tapAt); await waitInPage(floor, (n) => window.__benchProbe.samples.length >= n, k); };
    const floorPut = async (k) => { await touchTap(cdpF, putAt); await waitInPage(floor, (n) => window.benchIdbSamples.length >= n, k); };
    const screenTap = async (k) => { await touchTap(cdpS, screenAt); await waitInPage(screen, (n) => window.__benchProbe.samples.length >= n, k); };
    const appTap = async (k) => { await touchTap(cdpA, buttonAt); await waitInPage(pageA, (n) => window.__benchProbe.samples.length >= n, k); };
    const read = (page, expr) => page.evaluate(expr);

    // At full speed: frame_floor, idb_floor and tap_paint, tap_durable in turns.
    for (let i = 1; i <= warmup + taps; i++) {
      await floorTap(i); await jitter();
      await floorPut(i); await jitter();
      await appTap(i); await jitter();
    }
    const frame = (await read(floor, () => window.__benchProbe.samples)).slice(warmup);
    const idb = (await read(floor, () => window.benchIdbSamples)).slice(warmup);
    const paint = (await read(pageA, () => window.__benchProbe.samples)).slice(warmup);
    const tapTimes = (await read(pageA, () => window.__benchProbe.taps)).slice(warmup);
    await waitInPage(pageA, (n) => performance.getEntriesByName('sync:tap-durable').length >= n, warmup + taps);
    const marks = (await read(pageA, () => performance.getEntriesByName('sync:tap-durable').map((m) => m.startTime))).slice(warmup);
    const durable = tapTimes.map((t0, i) => marks[i] - t0);

    // CPU 4× slower on every page (DevTools CPU throttling): frame_floor_cpu4x, screen_floor_cpu4x and
    // tap_paint_cpu4x, in turns.
    for (const cdp of [cdpF, cdpS, cdpA]) await cdp.send('Emulation.setCPUThrottlingRate', { rate: 4 });
    const f0 = frame.length + warmup;
    const p0 = paint.length + warmup;
    for (let i = 1; i <= warmup + taps; i++) {
      await floorTap(f0 + i); await jitter();
      await screenTap(i); await jitter();
      await appTap(p0 + i); await jitter();
    }
    const frame4 = (await read(floor, () => window.__benchProbe.samples)).slice(f0 + warmup);
    const screen4 = (await read(screen, () => window.__benchProbe.samples)).slice(warmup);
    const paint4 = (await read(pageA, () => window.__benchProbe.samples)).slice(p0 + warmup);
    for (const cdp of [cdpF, cdpS, cdpA]) await cdp.send('Emulation.setCPUThrottlingRate', { rate: 1 });
    await screen.close();

    // a_to_b: a tap on tablet A → the first frame on tablet B that shows it, through the server and
    // PostgreSQL; raw_rtt in turns with it: bare emit-with-ack round trips.
    const newest = await pageA.locator(ROW).first().getAttribute('data-event-id');
    const pageB = await openCapture(b, caseId, newest);
    await pageB.evaluate(installWatchProbe, { row: ROW });
    const aToB = [];
    const rtt = [];
    for (let i = 0; i < warmup + taps; i++) {
      const before = await read(pageA, () => window.__benchProbe.epochs.length);
      await touchTap(cdpA, buttonAt);
      await waitInPage(pageA, (k) => window.__benchProbe.epochs.length > k, before);
      const epoch = await read(pageA, () => window.__benchProbe.epochs.at(-1));
      const id = await pageA.locator(ROW).first().getAttribute('data-event-id');
      await waitInPage(pageB, (eventId) => window.__benchWatch.seen.has(eventId), id);
      const seenAt = await pageB.evaluate((eventId) => window.__benchWatch.seen.get(eventId), id);
      if (i >= warmup) aToB.push(seenAt - epoch);
      await jitter();
      for (let r = 0; r < 3; r++) { const ms = await floor.evaluate(() => window.benchRttPing()); if (i >= warmup) rtt.push(ms); }
      await jitter();
    }
    return { frame, frame4, screen4, idb, paint, paint4, durable, aToB, rtt };
  } finally {
    await floorCtx.close();
    await a.close();
    await b.close();
    await screenCtx.close();
  }
}
