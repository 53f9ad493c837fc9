import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateLotBody } from '../../../../shared/schemas/lots';
import { apiFetch } from '../../../lib/api-client';
import { lotResponseSchema } from './get-lot';
import { lotApiPaths, lotKeys } from './keys';

/** POST /api/banks/:bankId/lots (grower); 400 with fields, 409 duplicate_code. */
export async function createLot(bankId: string, body: CreateLotBody) {
  return (await apiFetch(lotApiPaths.lots(bankId), { method: 'POST', body, schema: lotResponseSchema })).lot;
}

export function useCreateLot(bankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateLotBody) => createLot(bankId, body),
    onSuccess: async (lot) => {
      queryClient.setQueryData(lotKeys.detail(bankId, lot.id), lot);
      await queryClient.invalidateQueries({ queryKey: lotKeys.lists(bankId) });
    },
  });
}
