import { queryOptions, useQuery } from '@tanstack/react-query';
import { invitationPublicSchema } from '#shared/schemas/api-invitations.ts';
import { api } from '@/lib/api.ts';

/** GET /api/invitations/:id — what the invitee sees before joining (no session needed). */
export const getInvitation = (id: string, signal?: AbortSignal) =>
  api(`/api/invitations/${encodeURIComponent(id)}`, { schema: invitationPublicSchema, signal });

export const invitationQueryOptions = (id: string) =>
  queryOptions({ queryKey: ['invitations', id], queryFn: ({ signal }) => getInvitation(id, signal), retry: false });

export function useInvitation(id: string) {
  return useQuery(invitationQueryOptions(id));
}
