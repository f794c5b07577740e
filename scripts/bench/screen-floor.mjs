// The screen's own floor: the capture screen's DOM as it stands, copied into a static page (its
// stylesheets, no scripts), where a tap does by hand, in a few lines, only what a tap must do: the
// count goes up by one, a row is added at the top (a copy of the newest), one record is put in
// IndexedDB ('strict'), and the row pushed off the end goes after the frame. No React, no sync, no
// record. What the browser needs to draw that screen for a tap is then measured apart from the app's
// own work: the app can get no closer to frame_floor than this page does.

export const SCREEN_FLOOR_PATH = '/bench/screen-floor.html';

/** In the page: the handler of the copy. Runs there, so it may use nothing from this module. */
function screenFloorHandler({ button, counter, list, limit }) {
  let n = 0;
  let db = null;
  const open = indexedDB.open('bench-screen-floor', 1);
  open.onupgradeneeded = () => open.result.createObjectStore('taps');
  open.onsuccess = () => { db = open.result; };
  window.addEventListener('pointerdown', (e) => {
    if (!(e.target instanceof Element) || !e.target.closest(button)) return;
    const count = document.querySelector(counter);
    count.textContent = String(Number(count.textContent) + 1);
    const ol = document.querySelector(list);
    const row = ol.firstElementChild.cloneNode(true);
    row.setAttribute('data-event-id', `screen-floor-${++n}`);
    ol.prepend(row);
    db?.transaction('taps', 'readwrite', { durability: 'strict' }).objectStore('taps')
      .put({ n, at: Date.now(), kind: 'clip_fired', payload: { outcome: 'deployed' } }, n);
    requestAnimationFrame(() => setTimeout(() => { while (ol.children.length > limit) ol.lastElementChild.remove(); }, 0));
  });
}

/**
 * Open the copy of `livePage` (the capture screen, loaded) in `context`, served at SCREEN_FLOOR_PATH
 * by the context itself. `sel` names the button, the counter and the list of the screen.
 */
export async function openScreenFloor(context, livePage, sel) {
  const html = await livePage.evaluate(() => {
    const doc = document.documentElement.cloneNode(true);
    for (const s of doc.querySelectorAll('script, link[rel="modulepreload"], link[rel="manifest"]')) s.remove();
    return `<!doctype html>${doc.outerHTML}`;
  });
  const limit = await livePage.evaluate((list) => document.querySelector(list).children.length, sel.list);
  const script = `<script>(${screenFloorHandler.toString()})(${JSON.stringify({ ...sel, limit })});</script>`;
  await context.route(`**${SCREEN_FLOOR_PATH}`, (route) => route.fulfill({ contentType: 'text/html; charset=utf-8', body: html.replace('</body>', `${script}</body>`) }));
  const page = await context.newPage();
  await page.goto(SCREEN_FLOOR_PATH);
  await page.locator(sel.button).waitFor();
  await page.evaluate(() => document.fonts.ready);
  return page;
}
