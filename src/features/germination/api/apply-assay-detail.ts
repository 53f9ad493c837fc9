import type { QueryClient } from '@tanstack/react-query';
import type { AssayDetail } from '#shared/schemas/germination';
import { bankKeys, refresh, stale } from '#src/lib/bank-api';

/**
 * After a change answered with the test's new state: put it in the cache (the server answers with
 * its default Wilson interval), refetch the exact-interval copy if one is on screen, and refresh
 * what the test's lot derives from its germination (and its stock, when seeds moved).
 */
export async function applyAssayDetail(
  queryClient: QueryClient,
  bankId: string,
  detail: AssayDetail,
  { stockMoved = false }: { stockMoved?: boolean } = {},
): Promise<void> {
  const wilsonKey = bankKeys.assayDetail(bankId, detail.test.id, 'wilson');
  queryClient.setQueryData(wilsonKey, detail);
  await Promise.all([
    queryClient.invalidateQueries({
      queryKey: bankKeys.assay(bankId, detail.test.id),
      predicate: (query) => JSON.stringify(query.queryKey) !== JSON.stringify(wilsonKey),
    }),
    refresh(
      queryClient,
      stale.germination(bankId, detail.test.lotId),
      stockMoved ? stale.stockMoved(bankId, detail.test.lotId) : [],
    ),
  ]);
}
