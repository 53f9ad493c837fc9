import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiFetch } from '#src/lib/api-client';
import { offerKeys, offerPaths } from './keys';

/** POST /api/offers/:offerId/decline: the offer closes and nothing moves. */
export function declineOffer(offerId: string, token?: string) {
  return apiFetch(offerPaths.decline(offerId), { method: 'POST', body: token ? { token } : {} });
}

export function useDeclineOffer() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ offerId, token }: { offerId: string; token?: string }) => declineOffer(offerId, token),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: offerKeys.all }),
  });
}
