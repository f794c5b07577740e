import type { RequestHandler } from 'express';
import { rateLimit } from 'express-rate-limit';
import type { ApiError } from '#shared/schemas/common.ts';

/**
 * Failed sign-ins per client address: only answers of 400 and above count, so a unit's tablets behind
 * one address are not locked out by colleagues who typed their password right.
 */
export function signInLimiter({ windowMs, limit }: { windowMs: number; limit: number }): RequestHandler {
  return rateLimit({
    windowMs,
    limit,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, res) => {
      const minutes = Math.max(1, Math.ceil(windowMs / 60_000));
      res.status(429).json({ error: `Too many failed sign-ins from this address; try again in ${minutes} minute${minutes > 1 ? 's' : ''}` } satisfies ApiError);
    },
  });
}
