import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useNavigate } from 'react-router';
import { authClient } from '@/lib/auth-client.ts';
import { clearApiCache } from '@/lib/offline-cache.ts';
import { clearMe } from '@/lib/session-cache.ts';
import { runSignOutHooks } from '@/lib/sign-out-hooks.ts';

/**
 * Ends the session and wipes what this tablet kept of it: the saved user, the query cache and the
 * service worker's copies of API answers (they hold patient data), and closes the sync socket (it holds
 * the session; queued taps stay queued). Offline, the local part still runs.
 */
export async function signOut(): Promise<void> {
  try {
    await authClient.signOut();
  } finally {
    runSignOutHooks();
    clearMe();
    await clearApiCache();
  }
}

export function useSignOut() {
  const qc = useQueryClient();
  const navigate = useNavigate();
  return useMutation({
    mutationFn: signOut,
    // Leave the signed-in screens first, so nothing on them reads the cache being cleared.
    onSettled: async () => {
      await navigate('/sign-in', { replace: true });
      qc.clear();
    },
  });
}
