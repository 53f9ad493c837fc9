import { useMutation } from '@tanstack/react-query';
import type { z } from 'zod';
import type { passwordResetBodySchema } from '#shared/schemas/accounts';
import { apiFetch } from '#src/lib/api-client';

export type PasswordResetBody = z.infer<typeof passwordResetBodySchema>;

/** POST /api/auth/password-reset: always 202, whether or not the address has an account. */
export async function requestPasswordReset(body: PasswordResetBody): Promise<void> {
  await apiFetch('/api/auth/password-reset', { method: 'POST', body });
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
