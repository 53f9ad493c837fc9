import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiFetch } from '#src/lib/api-client';
import { forgetMemberData } from '#src/lib/forget-member-data';

/** POST /api/auth/logout: ends this browser's session. */
export async function logout(): Promise<void> {
  await apiFetch('/api/auth/logout', { method: 'POST' });
}

/** POST /api/auth/logout-all: ends every session of this account, on every device. */
export async function logoutEverywhere(): Promise<void> {
  await apiFetch('/api/auth/logout-all', { method: 'POST' });
}

/**
 * Signs out here or everywhere. Nothing of the account may stay in the cache or on the device
 * afterwards (writes waiting to send, answers kept for offline use), so both are cleared before
 * the caller moves on to the sign-in page.
 */
export function useLogout() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ everywhere }: { everywhere: boolean }) => (everywhere ? logoutEverywhere() : logout()),
    onSuccess: async () => {
      queryClient.clear();
      await forgetMemberData();
    },
  });
}
