import { queryOptions, useQuery } from '@tanstack/react-query';
import { receivedResponseSchema } from '#shared/schemas/offers';
import { apiFetch } from '#src/lib/api-client';
import { offerKeys, offerPaths } from './keys';

/** GET /api/banks/:bankId/lots/:lotId/received: how the lot came by an offer (null if it did not). */
export async function getReceived(bankId: string, lotId: string, { signal }: { signal?: AbortSignal } = {}) {
  return (await apiFetch(offerPaths.received(bankId, lotId), { schema: receivedResponseSchema, signal }))
    .received;
}

export function useReceived(bankId: string, lotId: string) {
  return useQuery(
    queryOptions({
      queryKey: offerKeys.received(bankId, lotId),
      queryFn: ({ signal }) => getReceived(bankId, lotId, { signal }),
    }),
  );
}
