// Debian's Chromium under Playwright for the bench (STACK.md), and signed-in tablet contexts.
import { readFileSync } from 'node:fs';
import { chromium } from '@playwright/test';

export const CHROMIUM_ARGS = [
  '--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
  '--disable-background-networking', '--disable-component-update', '--disable-sync',
  // Two tablets share one browser here: keep the one in the background rendering at full rate.
  '--disable-renderer-backgrounding', '--disable-background-timer-throttling', '--disable-backgrounding-occluded-windows',
];

export function launchBrowser() {
  return chromium.launch({ executablePath: '/usr/bin/chromium', args: CHROMIUM_ARGS });
}

export function demoPassword(root, email) {
  const users = JSON.parse(readFileSync(new URL('server/db/seed/demo-users.json', `file://${root}/`), 'utf8'));
  const user = users.find((u) => u.email === email);
  if (!user) throw new Error(`${email} is not a demo user`);
  return user.password;
}

/**
 * A tablet: a browser context in landscape 1280×800 with touch, signed in as `email` through the auth
 * API (its cookie is the context's own), or signed out when `email` is null. Service workers are
 * blocked: the bench measures the app, not a first-visit precache running beside it.
 */
export async function tabletContext(browser, { origin, root, email, bypassCSP = false }) {
  const context = await browser.newContext({
    baseURL: origin, viewport: { width: 1280, height: 800 }, hasTouch: true, isMobile: false,
    serviceWorkers: 'block', bypassCSP,
  });
  if (email === null) return context;
  const res = await context.request.post('/api/auth/sign-in/email', { data: { email, password: demoPassword(root, email) }, headers: { origin } });
  if (!res.ok()) throw new Error(`Sign-in of ${email} failed: ${res.status()} ${await res.text()}`);
  return context;
}
