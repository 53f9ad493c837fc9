import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { seedsToSowResponseSchema } from '../../../../shared/schemas/viability';
import { apiFetch } from '../../../lib/api-client';
import { viabilityApiPaths, viabilityKeys, type SeedsToSowQuery } from './keys';

/**
 * GET /api/banks/:bankId/lots/:lotId/seeds-to-sow?plants=&assurance=&on=; 422 when the lot has no
 * usable test yet (the message says to test it first).
 */
export function getSeedsToSow(bankId: string, lotId: string, query: SeedsToSowQuery, { signal }: { signal?: AbortSignal } = {}) {
  return apiFetch(viabilityApiPaths.seedsToSow(bankId, lotId, query), { schema: seedsToSowResponseSchema, signal });
}

export function seedsToSowQueryOptions(bankId: string, lotId: string, query: SeedsToSowQuery) {
  return queryOptions({
    queryKey: viabilityKeys.seedsToSow(bankId, lotId, query),
    queryFn: ({ signal }) => getSeedsToSow(bankId, lotId, query, { signal }),
  });
}

export function useSeedsToSow(bankId: string, lotId: string, query: SeedsToSowQuery | null) {
  return useQuery({
    ...seedsToSowQueryOptions(bankId, lotId, query ?? { plants: 1, assurance: 0.9, on: '' }),
    enabled: query !== null,
    placeholderData: keepPreviousData,
  });
}
