import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiFetch } from '#src/lib/api-client';
import { planEntryResponseSchema } from './create-plan-entry';
import { putEntry, refreshAfterPlanChange } from './invalidate-plan';
import { bankPaths } from '#src/lib/bank-api';

/**
 * POST /api/banks/:bankId/plan/:entryId/sown { date? } (grower): withdraws the entry's seeds from
 * its lot's stock. 409 when already sown or the stock is short; 422 without a tested lot or for a
 * date in the future.
 */
export async function markSown(bankId: string, entryId: string, date: string) {
  return (
    await apiFetch(bankPaths.planSown(bankId, entryId), {
      method: 'POST',
      body: { date },
      schema: planEntryResponseSchema,
    })
  ).entry;
}

export function useMarkSown(bankId: string, entryId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (date: string) => markSown(bankId, entryId, date),
    onSuccess: async (entry) => {
      putEntry(queryClient, bankId, entry);
      await refreshAfterPlanChange(queryClient, bankId, entry, { stockMoved: true });
    },
  });
}
