import { queryOptions, useQuery } from '@tanstack/react-query';
import { seedsToSowResponseSchema } from '../../../../shared/schemas/viability';
import { apiFetch } from '../../../lib/api-client';
import { planApiPaths, planKeys } from './keys';

/**
 * GET /api/banks/:bankId/lots/:lotId/seeds-to-sow?plants=N&on=YYYY-MM-DD: how many seeds of one
 * lot to sow for N plants on that day, in numbers and words; 422 when the lot has no test yet.
 */
export function getSeedsToSow(bankId: string, lotId: string, plants: number, on: string, { signal }: { signal?: AbortSignal } = {}) {
  return apiFetch(planApiPaths.seedsToSow(bankId, lotId, plants, on), { schema: seedsToSowResponseSchema, signal });
}

export function seedsToSowQueryOptions(bankId: string, lotId: string, plants: number, on: string) {
  return queryOptions({
    queryKey: planKeys.seedsToSow(bankId, lotId, plants, on),
    queryFn: ({ signal }) => getSeedsToSow(bankId, lotId, plants, on, { signal }),
  });
}

/** Only asks once there is a lot, a whole number of plants and a sowing day. */
export function useSeedsToSow(bankId: string, lotId: string, plants: number, on: string | undefined) {
  const ready = Boolean(lotId) && Number.isInteger(plants) && plants >= 1 && plants <= 100_000 && on !== undefined;
  return useQuery({ ...seedsToSowQueryOptions(bankId, lotId, plants, on ?? ''), enabled: ready });
}
