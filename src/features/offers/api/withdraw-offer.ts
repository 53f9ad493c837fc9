import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiFetch } from '#src/lib/api-client';
import { offerKeys, offerPaths } from './keys';

/** DELETE /api/banks/:bankId/lots/:lotId/offers/:offerId (grower): 409 once it is closed. */
export function withdrawOffer(bankId: string, lotId: string, offerId: string) {
  return apiFetch(offerPaths.lotOffer(bankId, lotId, offerId), { method: 'DELETE' });
}

export function useWithdrawOffer(bankId: string, lotId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (offerId: string) => withdrawOffer(bankId, lotId, offerId),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: offerKeys.lotOffers(bankId, lotId) }),
        queryClient.invalidateQueries({ queryKey: offerKeys.all }),
      ]),
  });
}
