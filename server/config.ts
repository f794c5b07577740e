import { z } from 'zod';
import { compileTrustProxy } from './http/client-address.ts';

/**
 * Every setting of the server, read once from the environment. Defaults are the local set-up that
 * `npm start` brings up (scripts/start.mjs); production sets each one explicitly.
 */
const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
  HOST: z.string().default('127.0.0.1'),
  PORT: z.coerce.number().int().min(1).max(65535).default(4410),
  /** The one connection string. */
  DATABASE_URL: z.string().default('postgres://postgres@127.0.0.1:54329/ledgerline'),
  /** The origin the browser uses (better-auth checks it). */
  BETTER_AUTH_URL: z.string().default('http://localhost:4410'),
  BETTER_AUTH_SECRET: z.string().min(32).optional(),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().default(2525),
  MAIL_FROM: z.string().default('Ledgerline <no-reply@ledgerline.invalid>'),
  /** The local mail fake's reading page, linked from the admin screens when set. */
  MAIL_WEB_URL: z.string().optional(),
  S3_ENDPOINT: z.string().default('http://127.0.0.1:4569'),
  S3_REGION: z.string().default('us-east-1'),
  S3_BUCKET: z.string().default('ledgerline'),
  S3_ACCESS_KEY_ID: z.string().default('S3RVER'),
  S3_SECRET_ACCESS_KEY: z.string().default('S3RVER'),
  /** Folder of the built client (vite build). */
  CLIENT_DIST: z.string().default('dist'),
  /**
   * How often each node checks that its open sockets' sessions still hold and that their users may still
   * read the cases whose rooms they are in (server/realtime/rights.ts).
   */
  RIGHTS_CHECK_MS: z.coerce.number().int().min(50).default(15_000),
  /**
   * Which proxies in front of the server to believe about the client's address (X-Forwarded-For): unset,
   * none; a number, that many hops; else a list such as `loopback` or `10.0.0.0/8` (server/http/client-address.ts).
   * The address is what the audit log writes and what failed sign-ins are counted by.
   */
  TRUST_PROXY: z.string().optional().superRefine((value, ctx) => {
    try { compileTrustProxy(value); } catch (err) { ctx.addIssue({ code: 'custom', message: (err as Error).message }); }
  }),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
});

export type Config = z.infer<typeof envSchema>;

export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`).join('\n');
    throw new Error(`Invalid environment:\n${lines}`);
  }
  return parsed.data;
}
