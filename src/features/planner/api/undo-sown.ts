import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiFetch } from '#src/lib/api-client';
import { planEntryResponseSchema } from './create-plan-entry';
import { putEntry, refreshAfterPlanChange } from './invalidate-plan';
import { bankPaths } from '#src/lib/bank-api';

/** DELETE /api/banks/:bankId/plan/:entryId/sown (grower): the seeds go back into the lot's stock. */
export async function undoSown(bankId: string, entryId: string) {
  return (
    await apiFetch(bankPaths.planSown(bankId, entryId), { method: 'DELETE', schema: planEntryResponseSchema })
  ).entry;
}

export function useUndoSown(bankId: string, entryId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => undoSown(bankId, entryId),
    onSuccess: async (entry) => {
      putEntry(queryClient, bankId, entry);
      await refreshAfterPlanChange(queryClient, bankId, entry, { stockMoved: true });
    },
  });
}
