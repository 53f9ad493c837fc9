import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { parentPlantSchema, type createPlantBodySchema } from '#shared/schemas/lots';
import { apiFetch } from '#src/lib/api-client';
import { bankPaths, refresh, stale } from '#src/lib/bank-api';

export type CreatePlantBody = z.infer<typeof createPlantBodySchema>;
export const plantResponseSchema = z.object({ plant: parentPlantSchema });

/** POST /api/banks/:bankId/plants (grower). */
export async function createPlant(bankId: string, body: CreatePlantBody) {
  return (await apiFetch(bankPaths.plants(bankId), { method: 'POST', body, schema: plantResponseSchema }))
    .plant;
}

export function useCreatePlant(bankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreatePlantBody) => createPlant(bankId, body),
    onSuccess: () => refresh(queryClient, stale.plantAdded(bankId)),
  });
}
