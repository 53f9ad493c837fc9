import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { rankingQueryOptions } from '#src/lib/queries/lot-queries';

export { rankingQueryOptions };

/** While another sowing date loads, the last ranking stays on screen (marked as refreshing). */
export function useRanking(bankId: string, on: string) {
  return useQuery({ ...rankingQueryOptions(bankId, on), placeholderData: keepPreviousData });
}
