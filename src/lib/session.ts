import { queryOptions, useQuery } from '@tanstack/react-query';
import { meSchema, type Me } from '#shared/schemas/session.ts';
import { api, ApiError, NetworkError } from './api.ts';
import { queryClient } from './query-client.ts';
import { clearMe, loadMe, saveMe } from './session-cache.ts';

/**
 * Who is signed in (GET /api/me). Used by the route guard, the header and any feature that needs the
 * user, their unit or their role. With no network (or the server down) it falls back to the last
 * answer kept on this tablet.
 */
export async function getMe(signal?: AbortSignal): Promise<Me> {
  try {
    const me = await api('/api/me', { schema: meSchema, signal });
    saveMe(me);
    return me;
  } catch (err) {
    if (err instanceof ApiError && err.isUnauthorised) {
      clearMe();
      throw err;
    }
    const unreachable = err instanceof NetworkError || (err instanceof ApiError && err.status >= 500);
    const cached = unreachable ? loadMe() : null;
    if (cached) return cached;
    throw err;
  }
}

export const meQueryKey = ['me'] as const;

export const meQueryOptions = () =>
  queryOptions({ queryKey: meQueryKey, queryFn: ({ signal }) => getMe(signal), staleTime: 5 * 60_000, retry: false });

/** The signed-in user; only inside the signed-in part of the app, where the guard has loaded it. */
export function useMe(): Me {
  const { data } = useQuery(meQueryOptions());
  if (!data) throw new Error('useMe() used outside the signed-in routes');
  return data;
}

/** The sign-in page, coming back to `url` afterwards. */
export function signInPath(url: URL): string {
  return `/sign-in?next=${encodeURIComponent(url.pathname + url.search)}`;
}

type Navigate = (to: string, options: { replace: boolean }) => Promise<void> | void;

/**
 * The session ended elsewhere (expired, revoked, signed out on another page): forget the saved user and
 * go to sign-in, coming back to this address afterwards. The user's queries are removed only once the
 * signed-in screens are left, since they read the user.
 */
export async function signInAgain(navigate: Navigate): Promise<void> {
  clearMe();
  await navigate(signInPath(new URL(window.location.href)), { replace: true });
  queryClient.removeQueries({ queryKey: meQueryKey });
}
