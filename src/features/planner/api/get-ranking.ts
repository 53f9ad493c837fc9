import { queryOptions, useQuery } from '@tanstack/react-query';
import { rankingResponseSchema } from '../../../../shared/schemas/viability';
import { apiFetch } from '../../../lib/api-client';
import { planApiPaths, planKeys } from './keys';

/**
 * GET /api/banks/:bankId/ranking?on=YYYY-MM-DD: every active or depleted lot with its germination
 * projected to that day, its stock and its retest date. The planner uses it for the lots a species
 * can be sown from, and for the retests in the season calendar.
 */
export function getRanking(bankId: string, on: string, { signal }: { signal?: AbortSignal } = {}) {
  return apiFetch(planApiPaths.ranking(bankId, on), { schema: rankingResponseSchema, signal });
}

export function rankingQueryOptions(bankId: string, on: string) {
  return queryOptions({
    queryKey: planKeys.ranking(bankId, on),
    queryFn: ({ signal }) => getRanking(bankId, on, { signal }),
  });
}

export function useRanking(bankId: string, on: string | undefined) {
  return useQuery({
    ...rankingQueryOptions(bankId, on ?? ''),
    enabled: on !== undefined,
    placeholderData: (previous) => previous,
    select: (response) => response.items,
  });
}
