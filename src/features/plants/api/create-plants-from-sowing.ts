import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { parentPlantSchema, type PlantsFromSowingBody } from '#shared/schemas/lots';
import { apiFetch } from '#src/lib/api-client';
import { bankPaths, refresh, stale } from '#src/lib/bank-api';

const plantsResponseSchema = z.object({ items: z.array(parentPlantSchema) });

/** POST /api/banks/:bankId/plants/from-sowing (grower): plants kept for seed from a sown entry. */
export async function createPlantsFromSowing(bankId: string, body: PlantsFromSowingBody) {
  return (
    await apiFetch(`${bankPaths.plants(bankId)}/from-sowing`, {
      method: 'POST',
      body,
      schema: plantsResponseSchema,
    })
  ).items;
}

export function useCreatePlantsFromSowing(bankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: PlantsFromSowingBody) => createPlantsFromSowing(bankId, body),
    onSuccess: () => refresh(queryClient, stale.plantAdded(bankId)),
  });
}
