import { queryOptions, useQuery } from '@tanstack/react-query';
import { meSchema, type Me } from '#shared/schemas/session.ts';
import { api, ApiError, NetworkError } from './api.ts';
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
