import { keepPreviousData, useQuery } from '@tanstack/react-query';
import type { SeedsToSowQuery } from '#src/lib/bank-api';
import { seedsToSowQueryOptions } from '#src/lib/queries/lot-queries';

/** The calculator keeps its last answer on screen while a changed number loads. */
export function useSeedsToSow(bankId: string, lotId: string, query: SeedsToSowQuery | null) {
  return useQuery({
    ...seedsToSowQueryOptions(bankId, lotId, query ?? { plants: 1, assurance: 0.9, on: '' }),
    enabled: query !== null,
    placeholderData: keepPreviousData,
  });
}
