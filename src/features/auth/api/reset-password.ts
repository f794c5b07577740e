import { useMutation } from '@tanstack/react-query';
import { authClient } from '@/lib/auth-client.ts';
import { throwAuthError } from './auth-error.ts';

/** Sets a new password with the one-time token from the reset mail. */
export async function resetPassword({ token, password }: { token: string; password: string }): Promise<void> {
  const { error } = await authClient.resetPassword({ newPassword: password, token });
  throwAuthError(error);
}

export function useResetPassword() {
  return useMutation({ mutationFn: resetPassword });
}
