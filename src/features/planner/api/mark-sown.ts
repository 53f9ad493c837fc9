import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SownBody } from '#shared/schemas/plan';
import { apiFetch } from '#src/lib/api-client';
import { planEntryResponseSchema } from './create-plan-entry';
import { putEntry, refreshAfterPlanChange } from './invalidate-plan';
import { bankPaths } from '#src/lib/bank-api';

/**
 * POST /api/banks/:bankId/plan/:entryId/sown { date, confirm? } (grower): withdraws the entry's
 * seeds from its lot's stock. 409 `outside_window` for a day outside the sowing window unless
 * confirmed, 409 when already sown or the stock is short; 422 without a tested lot or for a day
 * after today.
 */
export async function markSown(bankId: string, entryId: string, body: SownBody) {
  return (
    await apiFetch(bankPaths.planSown(bankId, entryId), {
      method: 'POST',
      body,
      schema: planEntryResponseSchema,
    })
  ).entry;
}

export function useMarkSown(bankId: string, entryId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: SownBody) => markSown(bankId, entryId, body),
    onSuccess: async (entry) => {
      putEntry(queryClient, bankId, entry);
      await refreshAfterPlanChange(queryClient, bankId, entry, { stockMoved: true });
    },
  });
}
