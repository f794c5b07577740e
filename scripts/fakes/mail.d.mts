// Types for mail.mjs (the tests import it in-process).
export interface FakeMessage {
  id: string;
  receivedAt: string;
  envelope: { from: string | null; to: string[] };
  from: string;
  to: string[];
  cc: string[];
  subject: string;
  date: string;
  messageId: string | null;
  text: string;
  html: string | null;
  links: string[];
  attachments: { filename: string | null; contentType: string; size: number }[];
}
export interface MailFake {
  smtpPort: number;
  webPort: number;
  /** Newest first; only those addressed to `to` when given. */
  messages(to?: string): FakeMessage[];
  close(): Promise<void>;
}
export function extractLinks(text: string | undefined, html: string | null | undefined): string[];
export function startMailFake(options: {
  smtpPort: number; webPort: number; dir: string; host?: string; log?: (line: string) => void;
}): Promise<MailFake>;
