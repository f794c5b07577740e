import { useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import { authClient } from '@/lib/auth-client.ts';
import { throwAuthError } from './auth-error.ts';

export const requestResetSchema = z.object({
  email: z.string().trim().min(1, 'Enter your e-mail address').pipe(z.email('Enter the e-mail address in full, like name@hospital.org')),
});
export type RequestResetInput = z.infer<typeof requestResetSchema>;

/** Asks for a reset link by e-mail. The answer is the same whether or not the address has an account. */
export async function requestPasswordReset({ email }: RequestResetInput): Promise<void> {
  const { error } = await authClient.requestPasswordReset({ email, redirectTo: `${window.location.origin}/reset-password` });
  throwAuthError(error);
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
