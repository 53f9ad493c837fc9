import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UpdateLotBody } from '../../../../shared/schemas/lots';
import { apiFetch } from '../../../lib/api-client';
import { lotResponseSchema } from './get-lot';
import { lotApiPaths, lotKeys } from './keys';

/** PATCH /api/banks/:bankId/lots/:lotId (grower): only the fields sent change. */
export async function updateLot(bankId: string, lotId: string, body: UpdateLotBody) {
  return (await apiFetch(lotApiPaths.lot(bankId, lotId), { method: 'PATCH', body, schema: lotResponseSchema })).lot;
}

export function useUpdateLot(bankId: string, lotId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: UpdateLotBody) => updateLot(bankId, lotId, body),
    onSuccess: async (lot) => {
      queryClient.setQueryData(lotKeys.detail(bankId, lotId), lot);
      await queryClient.invalidateQueries({ queryKey: lotKeys.lists(bankId) });
    },
  });
}
