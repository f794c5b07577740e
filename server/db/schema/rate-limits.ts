import { index, integer, pgTable, text, timestamp } from 'drizzle-orm/pg-core';

/**
 * Counters of the rate limiters, one row per limiter and client address, shared by every node of the
 * server (a count kept in each node's memory would give N nodes N times the attempts).
 */
export const rateLimitHits = pgTable('rate_limit_hits', {
  /** The limiter's prefix and the client's address, e.g. `sign-in:203.0.113.7`. */
  key: text('key').primaryKey(),
  hits: integer('hits').notNull(),
  /** When the current window ends: the count starts again from the first hit after it. */
  resetAt: timestamp('reset_at', { withTimezone: true }).notNull(),
}, (t) => [index('rate_limit_hits_reset_idx').on(t.resetAt)]);
