import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PlanEntryDto } from '#shared/schemas/plan';
import { apiFetch } from '#src/lib/api-client';
import type { PlanList } from './get-plan';
import { refreshAfterPlanChange } from './invalidate-plan';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

/** DELETE /api/banks/:bankId/plan/:entryId (grower) → 204; 409 already_sown while it is sown. */
export async function deletePlanEntry(bankId: string, entryId: string): Promise<void> {
  await apiFetch(bankPaths.planEntry(bankId, entryId), { method: 'DELETE' });
}

export function useDeletePlanEntry(bankId: string, entry: PlanEntryDto) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => deletePlanEntry(bankId, entry.id),
    onSuccess: async () => {
      queryClient.setQueryData<PlanList>(bankKeys.planSeason(bankId, entry.season), (plan) =>
        plan ? { ...plan, items: plan.items.filter((e) => e.id !== entry.id) } : plan,
      );
      await refreshAfterPlanChange(queryClient, bankId, entry, { stockMoved: false });
    },
  });
}
