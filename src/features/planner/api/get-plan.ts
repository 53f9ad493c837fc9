import { queryOptions, useQuery } from '@tanstack/react-query';
import { planListResponseSchema } from '#shared/schemas/plan';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

/** GET /api/banks/:bankId/plan?season=YYYY: the season's entries, earliest sowing first. */
export async function getPlan(bankId: string, season: number, { signal }: { signal?: AbortSignal } = {}) {
  return (await apiFetch(bankPaths.planSeason(bankId, season), { schema: planListResponseSchema, signal }))
    .items;
}

export function planQueryOptions(bankId: string, season: number) {
  return queryOptions({
    queryKey: bankKeys.planSeason(bankId, season),
    queryFn: ({ signal }) => getPlan(bankId, season, { signal }),
  });
}

export function usePlan(bankId: string, season: number) {
  return useQuery({ ...planQueryOptions(bankId, season), placeholderData: (previous) => previous });
}
