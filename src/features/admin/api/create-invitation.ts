import { useMutation } from '@tanstack/react-query';
import type { z } from 'zod';
import { createInvitationSchema, invitationSchema, type CreateInvitationInput } from '#shared/schemas/api-invitations.ts';
import { api } from '@/lib/api.ts';

/** POST /api/invitations — invite someone to the unit in one role (admins only; the server checks). */
export type InviteFormValues = z.input<typeof createInvitationSchema>;

export const createInvitation = (input: CreateInvitationInput) => api('/api/invitations', { method: 'POST', body: input, schema: invitationSchema });

export function useCreateInvitation() {
  return useMutation({ mutationFn: createInvitation });
}
