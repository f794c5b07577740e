import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { authClient } from '@/lib/auth-client.ts';
import { meQueryKey } from '@/lib/session.ts';
import { throwAuthError } from './auth-error.ts';

export const signInSchema = z.object({
  email: z.string().trim().min(1, 'Enter your e-mail address').pipe(z.email('Enter the e-mail address in full, like name@hospital.org')),
  password: z.string().min(1, 'Enter your password'),
});
export type SignInInput = z.infer<typeof signInSchema>;

export async function signIn(input: SignInInput): Promise<void> {
  const { error } = await authClient.signIn.email({ email: input.email, password: input.password });
  throwAuthError(error);
}

export function useSignIn() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    // The next screen's guard asks /api/me afresh.
    onSuccess: () => qc.removeQueries({ queryKey: meQueryKey }),
  });
}
