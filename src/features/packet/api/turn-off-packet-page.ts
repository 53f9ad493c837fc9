import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

/** DELETE …/lots/:lotId/packet-page: off; its address stops working and labels open the lot again. */
export async function turnOffPacketPage(bankId: string, lotId: string) {
  await apiFetch(bankPaths.lotPacketPage(bankId, lotId), { method: 'DELETE' });
}

export function useTurnOffPacketPage(bankId: string, lotId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => turnOffPacketPage(bankId, lotId),
    onSuccess: () => queryClient.setQueryData(bankKeys.lotPacketPage(bankId, lotId), null),
  });
}
