import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { userSchema, type MeResponse, type RegisterBody } from '#shared/schemas/accounts';
import { apiFetch } from '#src/lib/api-client';
import { getMe } from './get-me';
import { authKeys } from './keys';

const registerResponseSchema = z.object({ user: userSchema });

/** POST /api/auth/register (the server signs the new account in), then GET /api/me. */
export async function register(body: RegisterBody): Promise<MeResponse> {
  await apiFetch('/api/auth/register', { method: 'POST', body, schema: registerResponseSchema });
  return getMe();
}

export function useRegister() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: register,
    onSuccess: (me) => queryClient.setQueryData(authKeys.me(), me),
  });
}
