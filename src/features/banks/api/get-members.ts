import { queryOptions, useQuery } from '@tanstack/react-query';
import type { z } from 'zod';
import { membersResponseSchema } from '#shared/schemas/banks';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

export type MembersResponse = z.infer<typeof membersResponseSchema>;

/** GET /api/banks/:bankId/members: everyone in the bank with their role. */
export function getMembers(
  bankId: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<MembersResponse> {
  return apiFetch(bankPaths.members(bankId), { schema: membersResponseSchema, signal });
}

export function membersQueryOptions(bankId: string) {
  return queryOptions({
    queryKey: bankKeys.members(bankId),
    queryFn: ({ signal }) => getMembers(bankId, { signal }),
  });
}

export function useMembers(bankId: string) {
  return useQuery(membersQueryOptions(bankId));
}
