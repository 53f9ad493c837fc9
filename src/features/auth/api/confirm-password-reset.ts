import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { passwordResetConfirmBodySchema } from '#shared/schemas/accounts';
import { apiFetch } from '#src/lib/api-client';

export type PasswordResetConfirmBody = z.infer<typeof passwordResetConfirmBodySchema>;

/** POST /api/auth/password-reset/confirm: sets the new password and ends every session. */
export async function confirmPasswordReset(body: PasswordResetConfirmBody): Promise<void> {
  await apiFetch('/api/auth/password-reset/confirm', { method: 'POST', body });
}

export function useConfirmPasswordReset() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: confirmPasswordReset,
    // Every session of the account is gone now, this browser's included.
    onSuccess: () => queryClient.clear(),
  });
}
