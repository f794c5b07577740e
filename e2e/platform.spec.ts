import { createMailer } from '../server/services/mail.ts';
import { testPorts } from '../scripts/lib/ports.mjs';
import { demoUsers, expect, test } from './fixtures.ts';

// The test platform itself: the served app, the mail helper and the sign-in fixtures that every other
// browser test builds on.
test('the server serves the built app at the base URL', async ({ page }) => {
  await page.goto('/');
  await expect(page).toHaveTitle('Ledgerline');
});

test('the mail helper reads back the newest mail to an address, with its links', async ({ mail }) => {
  const to = `platform-${Date.now()}@kestrel-bay.example`;
  const mailer = createMailer({ SMTP_HOST: '127.0.0.1', SMTP_PORT: testPorts.smtp, MAIL_FROM: 'Ledgerline <no-reply@ledgerline.invalid>' });
  await mailer.send({ to, subject: 'Older notice', text: 'Nothing to open.' });
  await mailer.send({ to, subject: 'Set your password', text: 'Open http://localhost:4411/reset-password?token=abc to choose one.' });

  expect((await mail.latest(to)).subject).toBe('Set your password');
  expect(await mail.link(to, /reset-password/)).toBe('http://localhost:4411/reset-password?token=abc');
  expect((await mail.latest(to, { subject: 'Older' })).text).toContain('Nothing to open.');
});

test('login signs a demo user in, and a second tablet holds a session of its own', async ({ page, login, secondTablet }) => {
  const [first, second] = demoUsers();
  if (!first || !second) throw new Error('The seed wrote fewer than two demo users');
  await login(page, first.email);
  const other = await secondTablet(second.email);

  const me = async (p: typeof page) => (await (await p.request.get('/api/me')).json()) as { user: { email: string } };
  expect((await me(page)).user.email).toBe(first.email);
  expect((await me(other)).user.email).toBe(second.email);
});
