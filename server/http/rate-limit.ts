import type { RequestHandler } from 'express';
import { rateLimit, type IncrementResponse, type Options, type Store } from 'express-rate-limit';
import { and, eq, gt, lt, sql } from 'drizzle-orm';
import type { Db } from '#server/db/client.ts';
import { rateLimitHits } from '#server/db/schema/index.ts';
import type { ApiError } from '#shared/schemas/common.ts';

/** Expired counters are deleted once every this many hits on a node (our choice: the table stays small). */
const SWEEP_EVERY = 100;

/**
 * express-rate-limit's store in PostgreSQL (table `rate_limit_hits`): one counter per key for every
 * node of the server. A hit is one upsert that starts a new window when the old one has ended.
 */
export class PostgresRateLimitStore implements Store {
  readonly localKeys = false;
  private windowMs = 60_000;
  private hitsSinceSweep = 0;

  constructor(private readonly db: Db, readonly prefix: string) {}

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  async increment(key: string): Promise<IncrementResponse> {
    const k = this.prefix + key;
    const ends = sql`now() + ${this.windowMs}::double precision * interval '1 millisecond'`;
    const expired = sql`${rateLimitHits.resetAt} <= now()`;
    const [row] = await this.db.insert(rateLimitHits).values({ key: k, hits: 1, resetAt: ends })
      .onConflictDoUpdate({
        target: rateLimitHits.key,
        set: {
          hits: sql`case when ${expired} then 1 else ${rateLimitHits.hits} + 1 end`,
          resetAt: sql`case when ${expired} then ${ends} else ${rateLimitHits.resetAt} end`,
        },
      })
      .returning({ hits: rateLimitHits.hits, resetAt: rateLimitHits.resetAt });
    if (++this.hitsSinceSweep >= SWEEP_EVERY) {
      this.hitsSinceSweep = 0;
      await this.db.delete(rateLimitHits).where(lt(rateLimitHits.resetAt, sql`now()`));
    }
    return { totalHits: row!.hits, resetTime: row!.resetAt };
  }

  /** A request that did not count (a successful sign-in): its hit is taken back, in the same window. */
  async decrement(key: string): Promise<void> {
    await this.db.update(rateLimitHits).set({ hits: sql`greatest(${rateLimitHits.hits} - 1, 0)` })
      .where(and(eq(rateLimitHits.key, this.prefix + key), gt(rateLimitHits.resetAt, sql`now()`)));
  }

  async resetKey(key: string): Promise<void> {
    await this.db.delete(rateLimitHits).where(eq(rateLimitHits.key, this.prefix + key));
  }
}

export type SignInLimit = {
  windowMs: number;
  limit: number;
  /** The store's key prefix: every node of one server must share it (tests give each app its own). */
  prefix?: string;
};

/**
 * Failed sign-ins per client address: only answers of 400 and above count, so a unit's tablets behind
 * one address are not locked out by colleagues who typed their password right. Counted in PostgreSQL,
 * so several nodes behind one proxy share the count.
 */
export function signInLimiter(db: Db, { windowMs, limit, prefix = 'sign-in:' }: SignInLimit): RequestHandler {
  return rateLimit({
    windowMs,
    limit,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    store: new PostgresRateLimitStore(db, prefix),
    handler: (_req, res) => {
      const minutes = Math.max(1, Math.ceil(windowMs / 60_000));
      res.status(429).json({ error: `Too many failed sign-ins from this address; try again in ${minutes} minute${minutes > 1 ? 's' : ''}` } satisfies ApiError);
    },
  });
}
