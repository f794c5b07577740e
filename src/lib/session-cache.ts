import { meSchema, type Me } from '#shared/schemas/session.ts';

/**
 * The last answer of GET /api/me, kept in localStorage so that the shell shows who is signed in while
 * the tablet has no network. It grants nothing: every request is checked again by the server, and a
 * 401 clears it. Sign-out clears it too.
 */
const KEY = 'ledgerline.me';

export function saveMe(me: Me): void {
  try {
    localStorage.setItem(KEY, JSON.stringify({ me, savedAt: new Date().toISOString() }));
  } catch {
    // Storage full or refused (private mode): the shell then needs the network, nothing worse.
  }
}

export function loadMe(): Me | null {
  try {
    const raw = localStorage.getItem(KEY);
    if (!raw) return null;
    const parsed = meSchema.safeParse((JSON.parse(raw) as { me?: unknown }).me);
    return parsed.success ? parsed.data : null;
  } catch {
    return null;
  }
}

export function clearMe(): void {
  localStorage.removeItem(KEY);
}
