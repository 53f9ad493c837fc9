import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client';
import { plantApiPaths } from './keys';

/** DELETE /api/banks/:bankId/plants/:plantId (grower) → 204; lots keep their seed, lose the link. */
export async function deletePlant(bankId: string, plantId: string): Promise<void> {
  await apiFetch(plantApiPaths.plant(bankId, plantId), { method: 'DELETE' });
}

export function useDeletePlant(bankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (plantId: string) => deletePlant(bankId, plantId),
    // Lots list their parents' ids: refresh everything of the bank that could show the plant.
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['banks', bankId] }),
  });
}
