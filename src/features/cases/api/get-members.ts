import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { memberSchema } from '#shared/schemas/cases.ts';
import type { Role } from '#shared/schemas/common.ts';
import { api } from '@/lib/api.ts';

/** GET /api/members?role= — the unit's members holding one role (for the team pickers). */
export const getMembers = (role: Role, signal?: AbortSignal) => api('/api/members', { query: { role }, schema: z.array(memberSchema), signal });

export const membersQueryOptions = (role: Role) =>
  queryOptions({ queryKey: ['members', role], queryFn: ({ signal }) => getMembers(role, signal), staleTime: 10 * 60_000 });

export function useMembers(role: Role) {
  return useQuery(membersQueryOptions(role));
}
