/** Deepest nesting of objects and arrays in a request or an event (a real event nests four: the event, its payload, an amendment's fields, a value). */
export const MAX_DEPTH = 12;

const UNSTORABLE_TEXT = /\u0000|\p{Cs}/u;

export type Unstorable = { path: string; message: string };

/**
 * Why a value from a client cannot be stored exactly as sent, or null. PostgreSQL's text and jsonb take
 * no NUL character, and a lone UTF-16 surrogate (half of a pair, not a character) would be stored
 * changed (as U+FFFD in text; jsonb refuses it), so a repeat would no longer match what was stored.
 * Nesting is bounded, so that nothing after this check (a size count, a comparison, jsonb) walks a value
 * deep enough to overflow. Keys are strings too and are checked alike. `skip` names keys of the root
 * that are checked elsewhere, one item at a time (a push's events, each refused alone).
 */
export function unstorableIn(value: unknown, options: { skip?: readonly string[] } = {}): Unstorable | null {
  return walk(value, '', 0, options.skip ?? []);
}

function walk(value: unknown, path: string, depth: number, skip: readonly string[]): Unstorable | null {
  const at = path || '(root)';
  if (typeof value === 'string') return UNSTORABLE_TEXT.test(value) ? { path: at, message: 'contains a NUL character or a broken character, which cannot be stored' } : null;
  if (!value || typeof value !== 'object') return null;
  if (depth >= MAX_DEPTH) return { path: at, message: `nested more than ${MAX_DEPTH} levels deep` };
  for (const [key, inner] of Object.entries(value)) {
    if (UNSTORABLE_TEXT.test(key)) return { path: at, message: 'a field name contains a NUL character or a broken character, which cannot be stored' };
    if (depth === 0 && skip.includes(key)) continue;
    const found = walk(inner, path ? `${path}.${key}` : key, depth + 1, []);
    if (found) return found;
  }
  return null;
}
