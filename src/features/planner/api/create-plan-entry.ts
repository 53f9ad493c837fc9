import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { createPlanResponseSchema, planEntrySchema, type CreatePlanBody } from '#shared/schemas/plan';
import { apiFetch } from '#src/lib/api-client';
import { putEntry, refreshAfterPlanChange } from './invalidate-plan';
import { bankPaths } from '#src/lib/bank-api';

export const planEntryResponseSchema = z.object({ entry: planEntrySchema });

/**
 * POST /api/banks/:bankId/plan (grower) → 201 { entry, entries }: every sowing made (one, or each
 * of a succession). 422 when the bank has no last frost date or the species has no indoor window;
 * 400 with fields for a bad species, lot or succession.
 */
export async function createPlanEntry(bankId: string, body: CreatePlanBody) {
  return (await apiFetch(bankPaths.plan(bankId), { method: 'POST', body, schema: createPlanResponseSchema }))
    .entries;
}

export function useCreatePlanEntry(bankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreatePlanBody) => createPlanEntry(bankId, body),
    onSuccess: async (entries) => {
      for (const entry of entries) putEntry(queryClient, bankId, entry);
      await refreshAfterPlanChange(queryClient, bankId, entries[0]!, { stockMoved: false });
    },
  });
}
