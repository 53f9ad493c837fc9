import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { userSchema, type PublicUser } from '#shared/schemas/accounts';
import { apiFetch } from '#src/lib/api-client';
import { authKeys } from './keys';

const verifyResponseSchema = z.object({ user: userSchema });

/** POST /api/auth/verify-email: the link from the mail proves the account's address. */
export async function verifyEmail(token: string): Promise<PublicUser> {
  const { user } = await apiFetch('/api/auth/verify-email', {
    method: 'POST',
    body: { token },
    schema: verifyResponseSchema,
  });
  return user;
}

/** POST /api/auth/verify-email/resend (signed in): mails a new confirmation link. */
export async function resendVerification(): Promise<void> {
  await apiFetch('/api/auth/verify-email/resend', { method: 'POST' });
}

export function useVerifyEmail() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: verifyEmail,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: authKeys.me() }),
  });
}

export function useResendVerification() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: resendVerification,
    // 409 (already confirmed elsewhere) also means /api/me is out of date.
    onSettled: () => queryClient.invalidateQueries({ queryKey: authKeys.me() }),
  });
}
