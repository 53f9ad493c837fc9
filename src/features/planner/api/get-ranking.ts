import { useQuery } from '@tanstack/react-query';
import { rankingQueryOptions } from '#src/lib/queries/lot-queries';

export { rankingQueryOptions };

/**
 * The ranking's lots for the planner: the lots a species can be sown from, and the retests in the
 * season calendar. Waits for a sowing day; keeps the last lots while another day loads.
 */
export function useRanking(bankId: string, on: string | undefined) {
  return useQuery({
    ...rankingQueryOptions(bankId, on ?? ''),
    enabled: on !== undefined,
    placeholderData: (previous) => previous,
    select: (response) => response.items,
  });
}
