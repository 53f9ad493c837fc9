import { queryOptions, useQuery } from '@tanstack/react-query';
import type { z } from 'zod';
import { planListResponseSchema } from '#shared/schemas/plan';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

export type PlanList = z.infer<typeof planListResponseSchema>;

/**
 * GET /api/banks/:bankId/plan?season=YYYY: the season's entries, earliest sowing first, with their
 * dates as they are now, and the latest frost-date move of the season (`moved`).
 */
export async function getPlan(bankId: string, season: number, { signal }: { signal?: AbortSignal } = {}) {
  return apiFetch(bankPaths.planSeason(bankId, season), { schema: planListResponseSchema, signal });
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
