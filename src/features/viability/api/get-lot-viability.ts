import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { viabilityResponseSchema } from '#shared/schemas/viability';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

/** GET /api/banks/:bankId/lots/:lotId/viability?on=: the lot's fitted decline and its tests. */
export function getLotViability(
  bankId: string,
  lotId: string,
  on: string,
  { signal }: { signal?: AbortSignal } = {},
) {
  return apiFetch(bankPaths.lotViability(bankId, lotId, on), { schema: viabilityResponseSchema, signal });
}

export function lotViabilityQueryOptions(bankId: string, lotId: string, on: string) {
  return queryOptions({
    queryKey: bankKeys.lotViability(bankId, lotId, on),
    queryFn: ({ signal }) => getLotViability(bankId, lotId, on, { signal }),
  });
}

export function useLotViability(bankId: string, lotId: string, on: string) {
  return useQuery({ ...lotViabilityQueryOptions(bankId, lotId, on), placeholderData: keepPreviousData });
}
