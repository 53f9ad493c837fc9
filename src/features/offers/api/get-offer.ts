import { queryOptions, useQuery } from '@tanstack/react-query';
import { offerPreviewResponseSchema } from '#shared/schemas/offers';
import { apiFetch } from '#src/lib/api-client';
import { offerKeys, offerPaths } from './keys';

/** GET /api/offers/:offerId?token=: the offer as its receiver sees it before accepting. */
export async function getOffer(
  offerId: string,
  token: string | undefined,
  { signal }: { signal?: AbortSignal } = {},
) {
  return (await apiFetch(offerPaths.offer(offerId, token), { schema: offerPreviewResponseSchema, signal }))
    .offer;
}

export function useOffer(offerId: string, token: string | undefined) {
  return useQuery(
    queryOptions({
      queryKey: [...offerKeys.offer(offerId), token ?? null],
      queryFn: ({ signal }) => getOffer(offerId, token, { signal }),
    }),
  );
}
