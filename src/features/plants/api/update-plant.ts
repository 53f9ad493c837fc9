import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { updatePlantBodySchema } from '#shared/schemas/lots';
import { apiFetch } from '#src/lib/api-client';
import { bankPaths, refresh, stale } from '#src/lib/bank-api';
import { plantResponseSchema } from './create-plant';

export type UpdatePlantBody = z.infer<typeof updatePlantBodySchema>;

/** PATCH /api/banks/:bankId/plants/:plantId (grower). */
export async function updatePlant(bankId: string, plantId: string, body: UpdatePlantBody) {
  return (
    await apiFetch(bankPaths.plant(bankId, plantId), { method: 'PATCH', body, schema: plantResponseSchema })
  ).plant;
}

export function useUpdatePlant(bankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ plantId, body }: { plantId: string; body: UpdatePlantBody }) =>
      updatePlant(bankId, plantId, body),
    // Its warnings and its neighbours' (and the lot cards that read them) live under the plants.
    onSuccess: () => refresh(queryClient, stale.plantAdded(bankId)),
  });
}
