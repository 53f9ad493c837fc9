import { queryOptions, useQuery } from '@tanstack/react-query';
import { spacePlanResponseSchema } from '#shared/schemas/spaces';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

/** GET /api/banks/:bankId/plan/space?season=YYYY: the season's room under the lights, week by week. */
export async function getSpacePlan(
  bankId: string,
  season: number,
  { signal }: { signal?: AbortSignal } = {},
) {
  return apiFetch(bankPaths.planSpace(bankId, season), { schema: spacePlanResponseSchema, signal });
}

export function spacePlanQueryOptions(bankId: string, season: number) {
  return queryOptions({
    queryKey: bankKeys.planSpace(bankId, season),
    queryFn: ({ signal }) => getSpacePlan(bankId, season, { signal }),
  });
}

export function useSpacePlan(bankId: string, season: number) {
  return useQuery({ ...spacePlanQueryOptions(bankId, season), placeholderData: (previous) => previous });
}
