import { queryOptions, useQuery } from '@tanstack/react-query';
import { circleOffersResponseSchema } from '#shared/schemas/offers';
import { apiFetch } from '#src/lib/api-client';
import { offerKeys, offerPaths } from './keys';

/** GET /api/offers: open offers from and to the caller's banks, with each lot's latest test and age. */
export async function getCircleOffers({ signal }: { signal?: AbortSignal } = {}) {
  return (await apiFetch(offerPaths.circle(), { schema: circleOffersResponseSchema, signal })).items;
}

export function useCircleOffers() {
  return useQuery(
    queryOptions({ queryKey: offerKeys.circle(), queryFn: ({ signal }) => getCircleOffers({ signal }) }),
  );
}
