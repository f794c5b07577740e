import { data, redirect, type LoaderFunctionArgs } from 'react-router';
import type { Action } from '#shared/domain/permissions.ts';
import { can } from '#shared/domain/permissions.ts';
import type { Me } from '#shared/schemas/session.ts';
import { ApiError } from '@/lib/api.ts';
import { queryClient } from '@/lib/query-client.ts';
import { meQueryOptions, signInPath } from '@/lib/session.ts';

/**
 * The signed-in part of the app: loads /api/me (or, offline, the copy kept on the tablet); a signed-out
 * visitor goes to sign-in and comes back to the same address afterwards.
 */
export async function requireMe({ request }: Pick<LoaderFunctionArgs, 'request'>): Promise<Me> {
  try {
    return await queryClient.ensureQueryData(meQueryOptions());
  } catch (err) {
    if (err instanceof ApiError && err.isUnauthorised) throw redirect(signInPath(new URL(request.url)));
    throw err;
  }
}

/** As requireMe, and the role must allow `action` (else a 403 page). */
export async function requireCan(args: Pick<LoaderFunctionArgs, 'request'>, action: Action): Promise<Me> {
  const me = await requireMe(args);
  if (!can(me.role, action)) throw data({ error: 'Your role in the unit does not include this screen.' }, { status: 403 });
  return me;
}
