import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startMailFake, type FakeMessage, type MailFake } from '../../scripts/fakes/mail.mjs';
import { createMailer } from '../../server/services/mail.ts';

let fake: MailFake;
let dir: string;
const api = (path: string) => `http://127.0.0.1:${fake.webPort}${path}`;
const mailer = () => createMailer({ SMTP_HOST: '127.0.0.1', SMTP_PORT: fake.smtpPort, MAIL_FROM: 'Ledgerline <no-reply@ledgerline.invalid>' });
const messagesTo = async (to: string): Promise<FakeMessage[]> => (await fetch(api(`/api/messages?to=${encodeURIComponent(to)}`))).json() as Promise<FakeMessage[]>;

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'ledgerline-mail-'));
  fake = await startMailFake({ smtpPort: 0, webPort: 0, dir });
});
afterAll(async () => {
  await fake?.close();
  rmSync(dir, { recursive: true, force: true });
});

describe('the mailer and the local mail fake', () => {
  it('delivers a message that the fake keeps and serves back by recipient', async () => {
    const to = 'sofia.marin@kestrel-bay.example';
    await mailer().send({ to, subject: 'You are invited to Ledgerline', text: 'Accept here: http://localhost:4410/invite/abc123.\nThanks.' });

    const [message] = await messagesTo(to);
    expect(message?.subject).toBe('You are invited to Ledgerline');
    expect(message?.from).toContain('no-reply@ledgerline.invalid');
    expect(message?.envelope.to).toEqual([to]);
    // The trailing full stop is sentence punctuation, not part of the link.
    expect(message?.links).toEqual(['http://localhost:4410/invite/abc123']);
    expect(existsSync(join(dir, `${message?.id}.eml`))).toBe(true);
    const stored = JSON.parse(readFileSync(join(dir, `${message?.id}.json`), 'utf8')) as FakeMessage;
    expect(stored.text).toContain('Accept here');
  });

  it('finds links in the HTML part and matches recipients without regard to case', async () => {
    await mailer().send({
      to: 'Daniel.Kaur@Kestrel-Bay.example',
      subject: 'Reset your password',
      text: 'Open the reset page.',
      html: '<p><a href="http://localhost:4410/reset?token=t1&amp;x=1">Reset</a></p>',
    });
    const [message] = await messagesTo('daniel.kaur@kestrel-bay.example');
    expect(message?.links).toEqual(['http://localhost:4410/reset?token=t1&x=1']);
    expect(message?.html).toContain('<a href=');
  });

  it('returns only the messages addressed to the asked address, newest first', async () => {
    const to = 'priya.natarajan@kestrel-bay.example';
    await mailer().send({ to, subject: 'first', text: 'one' });
    await mailer().send({ to, subject: 'second', text: 'two' });
    const subjects = (await messagesTo(to)).map((m) => m.subject);
    expect(subjects).toEqual(['second', 'first']);
    expect(await messagesTo('nobody@kestrel-bay.example')).toEqual([]);
  });

  it('lists received messages on its reading page and shows one with its links', async () => {
    const to = 'amara.osei@kestrel-bay.example';
    await mailer().send({ to, subject: 'Report ready <case 7>', text: 'See http://localhost:4410/cases/7/report' });
    const index = await (await fetch(api('/'))).text();
    expect(index).toContain('Report ready &lt;case 7&gt;');
    const [message] = await messagesTo(to);
    const page = await (await fetch(api(`/messages/${message?.id}`))).text();
    expect(page).toContain('<a href="http://localhost:4410/cases/7/report">');
  });

  it('keeps its messages across a restart on the same folder', async () => {
    const before = fake.messages().length;
    await fake.close();
    fake = await startMailFake({ smtpPort: 0, webPort: 0, dir });
    expect(fake.messages()).toHaveLength(before);
  });

  it('reports a refused connection as a failed send', async () => {
    const closed = createMailer({ SMTP_HOST: '127.0.0.1', SMTP_PORT: 9, MAIL_FROM: 'x@ledgerline.invalid' });
    await expect(closed.send({ to: 'a@b.example', subject: 's', text: 't' })).rejects.toThrow();
  });
});
