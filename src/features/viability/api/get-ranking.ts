import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { rankingResponseSchema } from '../../../../shared/schemas/viability';
import { apiFetch } from '../../../lib/api-client';
import { viabilityApiPaths, viabilityKeys } from './keys';

/** GET /api/banks/:bankId/ranking?on=: every active or used-up lot, projected to `on`, with advice. */
export function getRanking(bankId: string, on: string, { signal }: { signal?: AbortSignal } = {}) {
  return apiFetch(viabilityApiPaths.ranking(bankId, on), { schema: rankingResponseSchema, signal });
}

export function rankingQueryOptions(bankId: string, on: string) {
  return queryOptions({
    queryKey: viabilityKeys.ranking(bankId, on),
    queryFn: ({ signal }) => getRanking(bankId, on, { signal }),
  });
}

/** While another sowing date loads, the last ranking stays on screen (marked as refreshing). */
export function useRanking(bankId: string, on: string) {
  return useQuery({ ...rankingQueryOptions(bankId, on), placeholderData: keepPreviousData });
}
