import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { randomBytes, randomUUID } from 'node:crypto';
import pino from 'pino';
import { createApp } from '#server/app.ts';
import { createAuth } from '#server/auth.ts';
import { loadConfig, type Config } from '#server/config.ts';
import { createDatabase } from '#server/db/client.ts';
import type { SignInLimit } from '#server/http/rate-limit.ts';
import { createMailer } from '#server/services/mail.ts';
import { startMailFake, type MailFake } from '../../../scripts/fakes/mail.mjs';
import { migratedDatabase } from './db.ts';

/** The origin the tests' "browser" claims; better-auth checks it on state-changing auth requests. */
export const ORIGIN = 'http://localhost:4410';

export type TestContext = Awaited<ReturnType<typeof createTestContext>>;

/**
 * The real app over the real database, with mail going to the local SMTP fake on a free port (read back
 * with `mail.messages(to)`). Sign-in limiting is loose unless a test asks for its own limit, and each
 * app's count is its own unless the test gives two apps one `prefix` (the count is kept in PostgreSQL).
 */
export async function createTestContext(options: { signInLimit?: SignInLimit; env?: Record<string, string>; databaseUrl?: string } = {}) {
  const url = options.databaseUrl ?? await migratedDatabase();
  const mailDir = mkdtempSync(join(tmpdir(), 'ledgerline-mail-'));
  const mail: MailFake = await startMailFake({ smtpPort: 0, webPort: 0, dir: mailDir });
  const config: Config = loadConfig({
    NODE_ENV: 'test', DATABASE_URL: url, BETTER_AUTH_URL: ORIGIN,
    BETTER_AUTH_SECRET: process.env.BETTER_AUTH_SECRET ?? randomBytes(32).toString('base64url'),
    SMTP_HOST: '127.0.0.1', SMTP_PORT: String(mail.smtpPort), LOG_LEVEL: 'silent',
    CLIENT_DIST: join(mailDir, 'no-client'), ...options.env,
  });
  const database = createDatabase(url, { max: 5 });
  const logger = pino({ level: 'silent' });
  const auth = createAuth({ db: database.db, config, mailer: createMailer(config), logger });
  const app = createApp({ config, db: database.db, auth, logger, signInLimit: {
    // A prefix of its own unless a test shares one between apps: each app of a test counts alone.
    prefix: `test-${randomUUID()}:`, ...(options.signInLimit ?? { windowMs: 60_000, limit: 1_000 }),
  } });
  return {
    config, db: database.db, pool: database.pool, auth, app, mail,
    async close() {
      await mail.close();
      await database.close();
      rmSync(mailDir, { recursive: true, force: true });
    },
  };
}
