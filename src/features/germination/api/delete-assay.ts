import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths, refresh, stale } from '#src/lib/bank-api';

/** Drops a deleted test from the cache, once no page shows it. */
export function forgetAssay(queryClient: QueryClient, bankId: string, assayId: string): void {
  queryClient.removeQueries({ queryKey: bankKeys.assay(bankId, assayId) });
}

/** DELETE /api/banks/:bankId/tests/:testId (grower) → 204; the test's seeds go back to its lot. */
export async function deleteAssay(bankId: string, assayId: string): Promise<void> {
  await apiFetch(bankPaths.assay(bankId, assayId), { method: 'DELETE' });
}

export function useDeleteAssay(bankId: string, assayId: string, lotId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => deleteAssay(bankId, assayId),
    // The page leaves first and then forgets the test (removing it under a mounted page refetches it).
    onSuccess: () => refresh(queryClient, stale.germination(bankId, lotId), stale.stockMoved(bankId, lotId)),
  });
}
