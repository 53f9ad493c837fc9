import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { lotSchema } from '#shared/schemas/lots';
import type { AcceptOfferBody } from '#shared/schemas/offers';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys } from '#src/lib/bank-api';
import { offerKeys, offerPaths } from './keys';

const acceptedSchema = z.object({ lot: lotSchema });

/** POST /api/offers/:offerId/accept: the new lot in the receiving bank; 409 once accepted or closed. */
export async function acceptOffer(offerId: string, body: AcceptOfferBody) {
  return (await apiFetch(offerPaths.accept(offerId), { method: 'POST', body, schema: acceptedSchema })).lot;
}

export function useAcceptOffer() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ offerId, body }: { offerId: string; body: AcceptOfferBody }) => acceptOffer(offerId, body),
    // Lots moved in two banks (the giver's may be one of the caller's too): every bank answer is stale.
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: bankKeys.all }),
        queryClient.invalidateQueries({ queryKey: offerKeys.all }),
      ]),
  });
}
