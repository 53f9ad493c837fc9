import { useMutation, useQueryClient } from '@tanstack/react-query';
import { packetPageSchema } from '#shared/schemas/packet';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

/** POST …/lots/:lotId/packet-page: on, with a new address (an address made before stops working). */
export async function turnOnPacketPage(bankId: string, lotId: string) {
  return (
    await apiFetch(bankPaths.lotPacketPage(bankId, lotId), { method: 'POST', schema: packetPageSchema })
  ).url;
}

export function useTurnOnPacketPage(bankId: string, lotId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => turnOnPacketPage(bankId, lotId),
    onSuccess: (url) => queryClient.setQueryData(bankKeys.lotPacketPage(bankId, lotId), url),
  });
}
