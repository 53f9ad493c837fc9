import { useMutation, useQueryClient } from '@tanstack/react-query';
import { createOfferResponseSchema, type CreateOfferBody } from '#shared/schemas/offers';
import { apiFetch } from '#src/lib/api-client';
import { offerKeys, offerPaths } from './keys';

/** POST /api/banks/:bankId/lots/:lotId/offers (grower): 409 above the seeds on hand. */
export function createOffer(bankId: string, lotId: string, body: CreateOfferBody) {
  return apiFetch(offerPaths.lotOffers(bankId, lotId), {
    method: 'POST',
    body,
    schema: createOfferResponseSchema,
  });
}

export function useCreateOffer(bankId: string, lotId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateOfferBody) => createOffer(bankId, lotId, body),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: offerKeys.lotOffers(bankId, lotId) }),
        queryClient.invalidateQueries({ queryKey: offerKeys.all }),
      ]),
  });
}
