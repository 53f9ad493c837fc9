import { useMutation, useQueryClient } from '@tanstack/react-query';
import { offerRequestResponseSchema } from '#shared/schemas/offers';
import { apiFetch } from '#src/lib/api-client';
import { offerKeys, offerPaths } from './keys';

/** POST /api/offers/:offerId/requests: ask the giver for an offered lot (a mail goes to them). */
export function askForOffer(offerId: string, note?: string) {
  return apiFetch(offerPaths.requests(offerId), {
    method: 'POST',
    body: note ? { note } : {},
    schema: offerRequestResponseSchema,
  });
}

export function useAskForOffer() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ offerId, note }: { offerId: string; note?: string }) => askForOffer(offerId, note),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: offerKeys.all }),
  });
}
