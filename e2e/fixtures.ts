import { readFileSync } from 'node:fs';
import { test as base, type BrowserContext, type Page } from '@playwright/test';
import { testPorts } from '../scripts/lib/ports.mjs';

export { expect } from '@playwright/test';

/** The origin the browser tests use (playwright.config.ts baseURL). */
export const origin = `http://localhost:${testPorts.app}`;
/** The test mail fake's JSON API (scripts/fakes/mail.mjs). */
export const mailApi = `http://127.0.0.1:${testPorts.mailWeb}`;

export interface DemoUser { email: string; name: string; role: string; password: string }

/** The demo sign-ins written by the seed (server/db/seed/demo-users.json). */
export function demoUsers(): DemoUser[] {
  return JSON.parse(readFileSync(new URL('../server/db/seed/demo-users.json', import.meta.url), 'utf8')) as DemoUser[];
}

export function demoUser(email: string): DemoUser {
  const user = demoUsers().find((u) => u.email.toLowerCase() === email.toLowerCase());
  if (!user) throw new Error(`${email} is not a demo user (server/db/seed/demo-users.json)`);
  return user;
}

/**
 * Sign in through the auth API in the page's own context (so its cookie is the browser's), then open
 * the app. Screens that test the sign-in form itself use the form instead.
 */
export async function login(page: Page, email: string, password = demoUser(email).password): Promise<void> {
  const res = await page.request.post('/api/auth/sign-in/email', { data: { email, password }, headers: { origin } });
  if (!res.ok()) throw new Error(`Sign-in of ${email} failed: ${res.status()} ${await res.text()}`);
  await page.goto('/');
}

export interface ReceivedMail {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  links: string[];
}

export interface MailQuery {
  /** Only a mail whose subject contains this text or matches this pattern. */
  subject?: string | RegExp;
  /** Only a mail received at or after this time (e.g. the start of the step that sends it). */
  since?: Date;
  timeoutMs?: number;
}

const matches = (mail: ReceivedMail, { subject, since }: MailQuery) =>
  (!since || new Date(mail.receivedAt) >= since)
  && (subject === undefined || (typeof subject === 'string' ? mail.subject.includes(subject) : subject.test(mail.subject)));

/** The newest mail to `to` in the mail fake; waits for it, since the server sends after it answers. */
export async function latestMail(to: string, query: MailQuery = {}): Promise<ReceivedMail> {
  const deadline = Date.now() + (query.timeoutMs ?? 10_000);
  let seen: ReceivedMail[] = [];
  for (;;) {
    const res = await fetch(`${mailApi}/api/messages?to=${encodeURIComponent(to)}`);
    if (!res.ok) throw new Error(`The mail fake answered ${res.status}`);
    seen = (await res.json()) as ReceivedMail[];
    const found = seen.find((m) => matches(m, query));
    if (found) return found;
    if (Date.now() > deadline) break;
    await new Promise((r) => setTimeout(r, 200));
  }
  const subjects = seen.map((m) => `"${m.subject}"`).join(', ') || 'none';
  throw new Error(`No mail to ${to} matching ${String(query.subject ?? 'any subject')} (mail to them: ${subjects})`);
}

/** The first link in the newest matching mail to `to` that matches `pattern` (e.g. /\/invite\//). */
export async function mailLink(to: string, pattern: RegExp, query: MailQuery = {}): Promise<string> {
  const mail = await latestMail(to, query);
  const link = mail.links.find((l) => pattern.test(l));
  if (!link) throw new Error(`The mail "${mail.subject}" to ${to} has no link matching ${pattern} (links: ${mail.links.join(', ') || 'none'})`);
  return link;
}

interface Fixtures {
  login: typeof login;
  mail: { latest: typeof latestMail; link: typeof mailLink };
  /** A second tablet: a new browser context with the same settings, signed in as `email`. */
  secondTablet: (email: string) => Promise<Page>;
}

export const test = base.extend<Fixtures>({
  // eslint-disable-next-line no-empty-pattern -- Playwright reads the fixture's dependencies from this pattern.
  login: async ({}, use) => { await use(login); },
  // eslint-disable-next-line no-empty-pattern -- as above.
  mail: async ({}, use) => { await use({ latest: latestMail, link: mailLink }); },
  secondTablet: async ({ browser, baseURL, viewport, hasTouch, serviceWorkers }, use) => {
    const contexts: BrowserContext[] = [];
    await use(async (email) => {
      const context = await browser.newContext({ baseURL, viewport, hasTouch, serviceWorkers });
      contexts.push(context);
      const page = await context.newPage();
      await login(page, email);
      return page;
    });
    for (const context of contexts) await context.close();
  },
});
