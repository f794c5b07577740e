// In-page measurements of `npm run bench`. Each function here is handed to page.evaluate, so it runs in
// the page and may use nothing from this module's scope.

/**
 * Paint probe: for every pointerdown, the time from the event's own timestamp to the end of the first
 * frame whose DOM shows the tap. In each animation frame after the tap it reads the DOM (before that
 * frame's style, layout and paint); when the counter's text and, if asked, the newest row have changed,
 * a MessageChannel message posted from that frame runs after the frame is rendered, and that moment
 * is the sample (the rAF + MessageChannel "next paint" method). Installed in the capture phase at
 * window, so it reads the "before" state ahead of any handler of the page. Taps outside `target` are
 * not measured.
 */
export function installPaintProbe({ target, counter, row }) {
  const probe = { samples: [], taps: [], epochs: [] };
  window.__benchProbe = probe;
  const read = () => [
    document.querySelector(counter)?.textContent ?? null,
    row ? (document.querySelector(row)?.getAttribute('data-event-id') ?? null) : null,
  ];
  window.addEventListener('pointerdown', (e) => {
    // Only taps on the measured button count (the bare page has a second button, for IndexedDB).
    if (!(e.target instanceof Element) || !e.target.closest(target)) return;
    const t0 = e.timeStamp;
    probe.taps.push(t0);
    probe.epochs.push(performance.timeOrigin + t0);
    const [c0, r0] = read();
    const frame = () => {
      const [c, r] = read();
      if (c !== c0 && (!row || r !== r0)) {
        const ch = new MessageChannel();
        ch.port1.onmessage = () => probe.samples.push(performance.now() - t0);
        ch.port2.postMessage(null);
      } else requestAnimationFrame(frame);
    };
    requestAnimationFrame(frame);
  }, { capture: true });
}

/**
 * Watch probe for the second tablet: on every DOM change, if the newest row is a new event, the end of
 * the next rendered frame (rAF + MessageChannel) is stamped in epoch ms with the row's id.
 */
export function installWatchProbe({ row }) {
  const probe = { seen: new Map() };
  window.__benchWatch = probe;
  let last = document.querySelector(row)?.getAttribute('data-event-id') ?? null;
  const observer = new MutationObserver(() => {
    const id = document.querySelector(row)?.getAttribute('data-event-id') ?? null;
    if (!id || id === last) return;
    last = id;
    requestAnimationFrame(() => {
      const ch = new MessageChannel();
      ch.port1.onmessage = () => { if (!probe.seen.has(id)) probe.seen.set(id, performance.timeOrigin + performance.now()); };
      ch.port2.postMessage(null);
    });
  });
  observer.observe(document.body, { subtree: true, childList: true, attributes: true, characterData: true });
}

/** Where a selector's element is, for a touch at its centre (CSS px of the viewport). */
export function centreOf(selector) {
  const r = document.querySelector(selector)?.getBoundingClientRect();
  return r ? { x: r.left + r.width / 2, y: r.top + r.height / 2 } : null;
}

/** One finger tap through the DevTools protocol: real touch input, as a tablet sends it. */
export async function touchTap(cdp, { x, y }) {
  await cdp.send('Input.dispatchTouchEvent', { type: 'touchStart', touchPoints: [{ x, y, id: 1, radiusX: 6, radiusY: 6, force: 1 }] });
  await cdp.send('Input.dispatchTouchEvent', { type: 'touchEnd', touchPoints: [] });
}
