import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateLotBody } from '#shared/schemas/lots';
import { apiFetch } from '#src/lib/api-client';
import { lotResponseSchema } from './get-lot';
import { bankKeys, bankPaths, refresh, stale } from '#src/lib/bank-api';

/** POST /api/banks/:bankId/lots (grower); 400 with fields, 409 duplicate_code. */
export async function createLot(bankId: string, body: CreateLotBody) {
  return (await apiFetch(bankPaths.lots(bankId), { method: 'POST', body, schema: lotResponseSchema })).lot;
}

export function useCreateLot(bankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateLotBody) => createLot(bankId, body),
    onSuccess: async (lot) => {
      queryClient.setQueryData(bankKeys.lot(bankId, lot.id), lot);
      await refresh(queryClient, stale.lotsAddedOrRemoved(bankId));
    },
  });
}
