import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiFetch } from '#src/lib/api-client';
import { bankPaths, refresh, stale } from '#src/lib/bank-api';

/** DELETE /api/banks/:bankId/plants/:plantId (grower) → 204; lots keep their seed, lose the link. */
export async function deletePlant(bankId: string, plantId: string): Promise<void> {
  await apiFetch(bankPaths.plant(bankId, plantId), { method: 'DELETE' });
}

export function useDeletePlant(bankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (plantId: string) => deletePlant(bankId, plantId),
    // The plant list, and the lots that named it as a parent.
    onSuccess: (_done, plantId) => refresh(queryClient, stale.plantRemoved(bankId, plantId)),
  });
}
