import type { QueryClient } from '@tanstack/react-query';
import type { TestDetail } from '../../../../shared/schemas/germination';
import { germinationKeys } from './keys';

/**
 * After a change answered with the test's new state: put it in the cache (the server answers with
 * its default Wilson interval), refetch the exact-interval copy if one is on screen, and refresh
 * the lots, whose stock and latest germination may have moved.
 */
export async function applyTestDetail(queryClient: QueryClient, bankId: string, detail: TestDetail): Promise<void> {
  const wilsonKey = germinationKeys.testDetail(bankId, detail.test.id, 'wilson');
  queryClient.setQueryData(wilsonKey, detail);
  await Promise.all([
    queryClient.invalidateQueries({
      queryKey: germinationKeys.test(bankId, detail.test.id),
      predicate: (query) => JSON.stringify(query.queryKey) !== JSON.stringify(wilsonKey),
    }),
    invalidateLots(queryClient, bankId),
  ]);
}

/** Every lot query of the bank: stock on hand, the lot's tests, the ranking. */
export function invalidateLots(queryClient: QueryClient, bankId: string): Promise<void> {
  return queryClient.invalidateQueries({ queryKey: germinationKeys.lots(bankId) });
}
