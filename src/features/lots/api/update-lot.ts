import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UpdateLotBody } from '#shared/schemas/lots';
import { apiFetch } from '#src/lib/api-client';
import { lotResponseSchema } from './get-lot';
import { bankKeys, bankPaths, refresh, stale } from '#src/lib/bank-api';

/** PATCH /api/banks/:bankId/lots/:lotId (grower): only the fields sent change. */
export async function updateLot(bankId: string, lotId: string, body: UpdateLotBody) {
  return (await apiFetch(bankPaths.lot(bankId, lotId), { method: 'PATCH', body, schema: lotResponseSchema }))
    .lot;
}

export function useUpdateLot(bankId: string, lotId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: UpdateLotBody) => updateLot(bankId, lotId, body),
    onSuccess: async (lot) => {
      queryClient.setQueryData(bankKeys.lot(bankId, lotId), lot);
      await refresh(queryClient, stale.lotEdited(bankId, lotId));
    },
  });
}
