import { queryOptions } from '@tanstack/react-query';
import { rankingResponseSchema, seedsToSowResponseSchema } from '#shared/schemas/viability';
import { apiFetch } from '../api-client';
import { bankKeys, bankPaths, type SeedsToSowQuery } from '../bank-api';

/*
 * The two lot-level answers that several screens read — the ranking (the Lots screen, the planner's
 * lot choices and retest dates) and seeds to sow (the lot page's calculator, the planner's form) —
 * fetched and cached in one place, so every screen shares one cached copy (keys and paths from
 * ../bank-api.ts).
 */

/** GET /api/banks/:bankId/ranking?on=: every active or used-up lot, projected to `on`, with advice. */
export function rankingQueryOptions(bankId: string, on: string) {
  return queryOptions({
    queryKey: bankKeys.ranking(bankId, on),
    queryFn: ({ signal }) =>
      apiFetch(bankPaths.ranking(bankId, on), { schema: rankingResponseSchema, signal }),
  });
}

/**
 * GET /api/banks/:bankId/lots/:lotId/seeds-to-sow?plants=&assurance=&on=: how many seeds of one lot
 * to sow for N plants on that day, in numbers and words; 422 when the lot has no usable test yet.
 */
export function seedsToSowQueryOptions(bankId: string, lotId: string, query: SeedsToSowQuery) {
  return queryOptions({
    queryKey: bankKeys.lotSeedsToSow(bankId, lotId, query),
    queryFn: ({ signal }) =>
      apiFetch(bankPaths.lotSeedsToSow(bankId, lotId, query), { schema: seedsToSowResponseSchema, signal }),
  });
}
