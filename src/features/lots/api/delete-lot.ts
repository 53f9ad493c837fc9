import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { lotSchema, type LotDto } from '#shared/schemas/lots';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths, refresh, stale } from '#src/lib/bank-api';

const retiredSchema = z.object({ lot: lotSchema, retired: z.literal(true) });

export type DeleteLotOutcome = { outcome: 'deleted' } | { outcome: 'retired'; lot: LotDto };

/**
 * DELETE /api/banks/:bankId/lots/:lotId (grower): 204 when the lot is gone, or 200 with the lot
 * retired instead when germination tests refer to it (their history is kept).
 */
export async function deleteLot(bankId: string, lotId: string): Promise<DeleteLotOutcome> {
  const body = await apiFetch(bankPaths.lot(bankId, lotId), { method: 'DELETE' });
  if (body === undefined) return { outcome: 'deleted' };
  const parsed = retiredSchema.parse(body);
  return { outcome: 'retired', lot: parsed.lot };
}

export function useDeleteLot(bankId: string, lotId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => deleteLot(bankId, lotId),
    onSuccess: async (result) => {
      // A deleted lot's own query is left to expire: its page is still on screen until the caller moves on.
      if (result.outcome === 'retired') queryClient.setQueryData(bankKeys.lot(bankId, lotId), result.lot);
      await refresh(queryClient, stale.lotsAddedOrRemoved(bankId));
    },
  });
}
