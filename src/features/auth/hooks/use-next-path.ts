import { useSearchParams } from 'react-router';

/**
 * Where to go after signing in: the `next` query parameter when it is a path of this app, else the
 * day's cases. A full URL or `//host` is refused, so a crafted link cannot send the user elsewhere.
 */
export function safeNextPath(next: string | null): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return '/cases';
  if (next.startsWith('/sign-in')) return '/cases';
  return next;
}

export function useNextPath(): string {
  const [params] = useSearchParams();
  return safeNextPath(params.get('next'));
}
