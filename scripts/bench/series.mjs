// Waiting in a page for what the bench measures.

/**
 * Wait until `fn(arg)` holds in the page, polled every 25 ms by timer (not every frame: a rAF poll
 * would keep the page painting and change what is measured).
 */
export async function waitInPage(page, fn, arg, timeoutMs = 15_000) {
  await page.waitForFunction(fn, arg, { polling: 25, timeout: timeoutMs });
}

