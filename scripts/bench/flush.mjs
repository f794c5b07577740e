// flush_5000_ms: a tablet comes back with 5,000 events queued; the time from its reconnect until the
// server has acknowledged every one (the screen's waiting count back to none).
import { v7 as uuidv7 } from 'uuid';
import { me, scheduleCase } from './api.mjs';
import { tabletContext } from './browser.mjs';
import { waitInPage } from './series.mjs';

/** Put entries into the tablet's IndexedDB outbox as the sync engine stores them (src/sync/outbox.ts). */
function writeOutbox(entries) {
  return new Promise((resolve, reject) => {
    const req = indexedDB.open('ledgerline');
    req.onerror = () => reject(req.error);
    req.onsuccess = () => {
      const db = req.result;
      const tx = db.transaction('outbox', 'readwrite', { durability: 'strict' });
      for (const e of entries) tx.objectStore('outbox').put(e, e.event.id);
      tx.oncomplete = () => { db.close(); resolve(entries.length); };
      tx.onerror = () => reject(tx.error);
    };
  });
}

function readDeviceId() {
  return new Promise((resolve, reject) => {
    const req = indexedDB.open('ledgerline');
    req.onerror = () => reject(req.error);
    req.onsuccess = () => {
      const db = req.result;
      const r = db.transaction('meta', 'readonly').objectStore('meta').get('deviceId');
      r.onsuccess = () => { db.close(); resolve(r.result); };
      r.onerror = () => reject(r.error);
    };
  });
}

/** Stamps the first moment the screen is connected, and the first moment after it with nothing waiting. */
function installFlushWatch() {
  const w = { connectedAt: null, doneAt: null };
  window.__benchFlush = w;
  const check = () => {
    const el = document.querySelector('[data-testid="connection"]');
    if (!el) return;
    const state = el.getAttribute('data-state');
    const waiting = el.querySelector('[data-testid="waiting-count"]')?.textContent ?? '';
    if (w.connectedAt === null && state !== 'offline') w.connectedAt = performance.now();
    if (w.connectedAt !== null && w.doneAt === null && state === 'online' && !/waiting/.test(waiting)) w.doneAt = performance.now();
  };
  new MutationObserver(check).observe(document, { subtree: true, childList: true, attributes: true, characterData: true });
}

export async function measureFlush(browser, { origin, root, email, n }) {
  const context = await tabletContext(browser, { origin, root, email });
  try {
    const caseId = await scheduleCase(context, origin);
    const author = (await me(context)).user.id;
    const page = await context.newPage();
    // First visit: the engine makes the tablet's database and its device id.
    await page.goto(`/cases/${caseId}/capture`);
    await page.locator('[data-testid="connection"][data-state="online"]').waitFor({ timeout: 30_000 });
    await page.goto('/bench/frame-floor.html');
    const device = await page.evaluate(readDeviceId);
    const start = Date.now() - n * 100;
    const kinds = [['clip_fired', { outcome: 'deployed' }], ['injection', { volumeMl: 1 }], ['coagulation', {}], ['image', { caption: 'view' }]];
    const entries = Array.from({ length: n }, (_, i) => {
      const at = start + i * 100;
      const [kind, payload] = kinds[i % kinds.length];
      return {
        event: { id: uuidv7({ msecs: at }), caseId, kind, payload, deviceTime: new Date(at).toISOString(), offsetMs: 0, offsetUncertaintyMs: 2, author, device },
        state: 'queued', reason: null, attempts: 0, discardOf: null,
      };
    });
    await page.evaluate(writeOutbox, entries);
    await page.addInitScript(installFlushWatch);
    await page.goto(`/cases/${caseId}/capture`);
    await waitInPage(page, () => window.__benchFlush.doneAt !== null, null, 120_000);
    const { connectedAt, doneAt } = await page.evaluate(() => window.__benchFlush);
    const res = await context.request.get(`/api/cases/${caseId}/events?after=0&limit=1`);
    const { lastSeq } = await res.json();
    if (lastSeq !== n) throw new Error(`After the flush the server holds ${lastSeq} events, not ${n}`);
    return Math.round(doneAt - connectedAt);
  } finally {
    await context.close();
  }
}
