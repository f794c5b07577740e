/**
 * Whether `err` is PostgreSQL's unique_violation (SQLSTATE 23505) on `constraint`. Drizzle wraps the
 * driver's error, so its cause is read too.
 */
export function isUniqueViolation(err: unknown, constraint: string): boolean {
  for (let e = err as { code?: unknown; constraint?: unknown; cause?: unknown } | undefined, depth = 0; e && depth < 3; e = e.cause as typeof e, depth++) {
    if (e.code === '23505' && e.constraint === constraint) return true;
  }
  return false;
}
