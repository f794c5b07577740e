import type { RequestHandler } from 'express';
import type { Logger } from 'pino';
import type { Auth } from '../auth.ts';
import type { Config } from '../config.ts';
import type { Db } from '../db/client.ts';
import type { SignInLimit } from './rate-limit.ts';

/** What createApp needs; startServer and the tests build it. */
export interface AppDeps {
  config: Config;
  db: Db;
  auth: Auth;
  logger: Logger;
  /** Failed sign-ins allowed per client address and window (default 10 per 15 minutes). */
  signInLimit?: SignInLimit;
}

/** What every module router receives: the deps and the one `authenticate` middleware. */
export interface ApiContext extends AppDeps {
  /** 401 without a session, 403 without a unit; sets `req.actor`. */
  authenticate: RequestHandler;
}
