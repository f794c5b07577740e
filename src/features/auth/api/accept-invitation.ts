import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { acceptInvitationSchema } from '#shared/schemas/api-invitations.ts';
import { api } from '@/lib/api.ts';
import { authClient } from '@/lib/auth-client.ts';
import { meQueryKey } from '@/lib/session.ts';
import { throwAuthError } from './auth-error.ts';

/** The server's accept body, plus the password typed twice (checked here only). */
export const acceptInvitationFormSchema = acceptInvitationSchema
  .extend({ confirm: z.string().min(1, 'Type the password again') })
  .refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'The two passwords differ' });
export type AcceptInvitationFormInput = z.infer<typeof acceptInvitationFormSchema>;

/**
 * POST /api/invitations/:id/accept — a new account for the invited address, in the unit with the
 * invited role; the answer signs the invitee in (session cookie).
 */
export const acceptAsNewUser = ({ invitationId, name, password }: { invitationId: string; name: string; password: string }) =>
  api(`/api/invitations/${encodeURIComponent(invitationId)}/accept`, { method: 'POST', body: { name, password } });

/** Someone who has an account already signs in first, then accepts through better-auth. */
export async function acceptAsSignedIn(invitationId: string): Promise<void> {
  const { error } = await authClient.organization.acceptInvitation({ invitationId });
  throwAuthError(error);
}

export function useAcceptAsNewUser() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: acceptAsNewUser, onSuccess: () => qc.removeQueries({ queryKey: meQueryKey }) });
}

export function useAcceptAsSignedIn() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: acceptAsSignedIn, onSuccess: () => qc.removeQueries({ queryKey: meQueryKey }) });
}
