import { queryOptions } from '@tanstack/react-query';
import { rankingResponseSchema, seedsToSowResponseSchema } from '../../../shared/schemas/viability';
import { apiFetch } from '../api-client';

/*
 * The two lot-level answers that several screens read — the ranking (the Lots screen, the planner's
 * lot choices and retest dates) and seeds to sow (the lot page's calculator, the planner's form) —
 * fetched and cached in one place, so every screen shares one cached copy. Their keys sit under the
 * lots prefix ['banks', bankId, 'lots'], so a change of stock or a new test anywhere refreshes them.
 */

export interface SeedsToSowQuery {
  plants: number;
  on: string;
  /** Left out, the server uses the bank's own assurance. */
  assurance?: number;
}

const bankPath = (bankId: string) => `/api/banks/${encodeURIComponent(bankId)}`;

export const lotQueryKeys = {
  lots: (bankId: string) => ['banks', bankId, 'lots'] as const,
  rankings: (bankId: string) => [...lotQueryKeys.lots(bankId), 'list', 'ranking'] as const,
  ranking: (bankId: string, on: string) => [...lotQueryKeys.rankings(bankId), { on }] as const,
  lot: (bankId: string, lotId: string) => [...lotQueryKeys.lots(bankId), 'detail', lotId] as const,
  seedsToSow: (bankId: string, lotId: string, query: SeedsToSowQuery) =>
    [...lotQueryKeys.lot(bankId, lotId), 'seeds-to-sow', query] as const,
};

export const lotQueryPaths = {
  ranking: (bankId: string, on: string) => `${bankPath(bankId)}/ranking?${new URLSearchParams({ on })}`,
  seedsToSow: (bankId: string, lotId: string, { plants, on, assurance }: SeedsToSowQuery) =>
    `${bankPath(bankId)}/lots/${encodeURIComponent(lotId)}/seeds-to-sow?${new URLSearchParams({
      plants: String(plants),
      ...(assurance === undefined ? {} : { assurance: String(assurance) }),
      on,
    })}`,
};

/** GET /api/banks/:bankId/ranking?on=: every active or used-up lot, projected to `on`, with advice. */
export function rankingQueryOptions(bankId: string, on: string) {
  return queryOptions({
    queryKey: lotQueryKeys.ranking(bankId, on),
    queryFn: ({ signal }) => apiFetch(lotQueryPaths.ranking(bankId, on), { schema: rankingResponseSchema, signal }),
  });
}

/**
 * GET /api/banks/:bankId/lots/:lotId/seeds-to-sow?plants=&assurance=&on=: how many seeds of one lot
 * to sow for N plants on that day, in numbers and words; 422 when the lot has no usable test yet.
 */
export function seedsToSowQueryOptions(bankId: string, lotId: string, query: SeedsToSowQuery) {
  return queryOptions({
    queryKey: lotQueryKeys.seedsToSow(bankId, lotId, query),
    queryFn: ({ signal }) => apiFetch(lotQueryPaths.seedsToSow(bankId, lotId, query), { schema: seedsToSowResponseSchema, signal }),
  });
}
