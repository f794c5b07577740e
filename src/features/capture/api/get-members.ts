import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { memberSchema } from '#shared/schemas/cases.ts';
import { api } from '@/lib/api.ts';

/** GET /api/members — the unit's people, so a row tapped on another tablet names who tapped it. */
export const captureMembersQueryOptions = () =>
  queryOptions({
    queryKey: ['members', 'all'],
    queryFn: ({ signal }) => api('/api/members', { schema: z.array(memberSchema), signal }),
    staleTime: 5 * 60_000,
  });

export function useCaptureMembers() {
  return useQuery(captureMembersQueryOptions());
}
