import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { userSchema, type LoginBody, type MeResponse } from '#shared/schemas/accounts';
import { apiFetch } from '#src/lib/api-client';
import { getMe } from './get-me';
import { authKeys } from './keys';

const loginResponseSchema = z.object({ user: userSchema });

/** POST /api/auth/login, then GET /api/me so the next page knows the person's banks at once. */
export async function login(body: LoginBody): Promise<MeResponse> {
  await apiFetch('/api/auth/login', { method: 'POST', body, schema: loginResponseSchema });
  return getMe();
}

export function useLogin() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: login,
    onSuccess: (me) => queryClient.setQueryData(authKeys.me(), me),
  });
}
