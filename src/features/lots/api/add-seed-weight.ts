import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { seedWeightSchema, type SeedWeightBody } from '#shared/schemas/lots';
import { apiFetch } from '#src/lib/api-client';
import { bankPaths, refresh, stale } from '#src/lib/bank-api';

const weighedSchema = z.object({ seedWeight: seedWeightSchema });

/** POST /api/banks/:bankId/lots/:lotId/seed-weights (grower) → the lot's seed weight now. */
export async function addSeedWeight(bankId: string, lotId: string, body: SeedWeightBody) {
  const path = `${bankPaths.lot(bankId, lotId)}/seed-weights`;
  return (await apiFetch(path, { method: 'POST', body, schema: weighedSchema })).seedWeight;
}

export function useAddSeedWeight(bankId: string, lotId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: SeedWeightBody) => addSeedWeight(bankId, lotId, body),
    // The lot's seed weight, and a weighed amount's seeds (its ledger, lists, plan) with it.
    onSuccess: () => refresh(queryClient, stale.lotEdited(bankId, lotId)),
  });
}
