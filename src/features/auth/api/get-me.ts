import { queryOptions, useQuery, type QueryClient } from '@tanstack/react-query';
import { meResponseSchema, type MeResponse } from '#shared/schemas/accounts';
import { apiFetch, isApiError } from '#src/lib/api-client';
import { authKeys } from './keys';

/** GET /api/me: who is signed in and the banks they belong to; 401 when nobody is. */
export function getMe({ signal }: { signal?: AbortSignal } = {}): Promise<MeResponse> {
  return apiFetch('/api/me', { schema: meResponseSchema, signal });
}

export function meQueryOptions() {
  return queryOptions({
    queryKey: authKeys.me(),
    queryFn: ({ signal }) => getMe({ signal }),
  });
}

export function useMe() {
  return useQuery(meQueryOptions());
}

/** For route loaders: the signed-in person, or null when the server says nobody is signed in. */
export async function ensureMe(queryClient: QueryClient): Promise<MeResponse | null> {
  try {
    return await queryClient.ensureQueryData(meQueryOptions());
  } catch (error) {
    if (isApiError(error) && error.status === 401) return null;
    throw error;
  }
}
