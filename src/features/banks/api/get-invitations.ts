import { queryOptions, useQuery } from '@tanstack/react-query';
import type { z } from 'zod';
import { invitationsResponseSchema } from '#shared/schemas/banks';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

export type InvitationsResponse = z.infer<typeof invitationsResponseSchema>;

/** GET /api/banks/:bankId/invitations (owner): the invitations nobody has accepted yet. */
export function getInvitations(
  bankId: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<InvitationsResponse> {
  return apiFetch(bankPaths.invitations(bankId), { schema: invitationsResponseSchema, signal });
}

export function invitationsQueryOptions(bankId: string) {
  return queryOptions({
    queryKey: bankKeys.invitations(bankId),
    queryFn: ({ signal }) => getInvitations(bankId, { signal }),
  });
}

export function useInvitations(bankId: string, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...invitationsQueryOptions(bankId), enabled });
}
