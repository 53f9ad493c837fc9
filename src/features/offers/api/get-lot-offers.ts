import { queryOptions, useQuery } from '@tanstack/react-query';
import { lotOffersResponseSchema } from '#shared/schemas/offers';
import { apiFetch } from '#src/lib/api-client';
import { offerKeys, offerPaths } from './keys';

/** GET /api/banks/:bankId/lots/:lotId/offers: the lot's offers, newest first, with who asked. */
export function getLotOffers(bankId: string, lotId: string, { signal }: { signal?: AbortSignal } = {}) {
  return apiFetch(offerPaths.lotOffers(bankId, lotId), { schema: lotOffersResponseSchema, signal });
}

export function useLotOffers(bankId: string, lotId: string) {
  return useQuery(
    queryOptions({
      queryKey: offerKeys.lotOffers(bankId, lotId),
      queryFn: ({ signal }) => getLotOffers(bankId, lotId, { signal }),
    }),
  );
}
