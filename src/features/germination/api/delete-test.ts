import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths, refresh, stale } from '#src/lib/bank-api';

/** Drops a deleted test from the cache, once no page shows it. */
export function forgetTest(queryClient: QueryClient, bankId: string, testId: string): void {
  queryClient.removeQueries({ queryKey: bankKeys.test(bankId, testId) });
}

/** DELETE /api/banks/:bankId/tests/:testId (grower) → 204; the test's seeds go back to its lot. */
export async function deleteTest(bankId: string, testId: string): Promise<void> {
  await apiFetch(bankPaths.test(bankId, testId), { method: 'DELETE' });
}

export function useDeleteTest(bankId: string, testId: string, lotId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => deleteTest(bankId, testId),
    // The page leaves first and then forgets the test (removing it under a mounted page refetches it).
    onSuccess: () => refresh(queryClient, stale.germination(bankId, lotId), stale.stockMoved(bankId, lotId)),
  });
}
