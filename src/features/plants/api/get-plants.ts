import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { parentPlantSchema } from '#shared/schemas/lots';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

const plantsResponseSchema = z.object({ items: z.array(parentPlantSchema) });

/** GET /api/banks/:bankId/plants: every parent plant of the bank, with photos and cautions. */
export async function getPlants(bankId: string, { signal }: { signal?: AbortSignal } = {}) {
  return (await apiFetch(bankPaths.plants(bankId), { schema: plantsResponseSchema, signal })).items;
}

export function plantsQueryOptions(bankId: string) {
  return queryOptions({
    queryKey: bankKeys.plantList(bankId),
    queryFn: ({ signal }) => getPlants(bankId, { signal }),
  });
}

export function usePlants(bankId: string) {
  return useQuery(plantsQueryOptions(bankId));
}
