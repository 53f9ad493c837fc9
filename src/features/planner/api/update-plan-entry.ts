import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { updatePlanBodySchema } from '#shared/schemas/plan';
import { apiFetch } from '#src/lib/api-client';
import { planEntryResponseSchema } from './create-plan-entry';
import { putEntry, refreshAfterPlanChange } from './invalidate-plan';
import { bankPaths } from '#src/lib/bank-api';

export type UpdatePlanBody = z.input<typeof updatePlanBodySchema>;

/** PATCH /api/banks/:bankId/plan/:entryId (grower); 409 already_sown once the entry is sown. */
export async function updatePlanEntry(bankId: string, entryId: string, body: UpdatePlanBody) {
  return (
    await apiFetch(bankPaths.planEntry(bankId, entryId), {
      method: 'PATCH',
      body,
      schema: planEntryResponseSchema,
    })
  ).entry;
}

export function useUpdatePlanEntry(bankId: string, entryId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: UpdatePlanBody) => updatePlanEntry(bankId, entryId, body),
    onSuccess: async (entry) => {
      putEntry(queryClient, bankId, entry);
      await refreshAfterPlanChange(queryClient, bankId, entry, { stockMoved: false });
    },
  });
}
