import nodemailer from 'nodemailer';
import type { Config } from '../config.ts';

export interface OutgoingMail {
  to: string;
  subject: string;
  /** The plain-text body; every mail has one, so links are readable in any client. */
  text: string;
  html?: string;
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
}

/**
 * Mail through any SMTP relay (locally, the fake from scripts/fakes/mail.mjs). One connection per
 * message: mail is rare here (invitations, resets, report notices), so a pool would only hold sockets.
 */
export function createMailer(config: Pick<Config, 'SMTP_HOST' | 'SMTP_PORT' | 'MAIL_FROM'>): Mailer {
  const transport = nodemailer.createTransport({
    host: config.SMTP_HOST,
    port: config.SMTP_PORT,
    // Port 465 is SMTP over TLS from the first byte (RFC 8314); other ports upgrade with STARTTLS when offered.
    secure: config.SMTP_PORT === 465,
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 20_000,
  });
  return {
    async send({ to, subject, text, html }) {
      const info = await transport.sendMail({ from: config.MAIL_FROM, to, subject, text, ...(html ? { html } : {}) });
      if (info.rejected.length) throw new Error(`Mail to ${to} was refused by the SMTP server`);
    },
  };
}
