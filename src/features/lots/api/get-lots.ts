import { infiniteQueryOptions, useInfiniteQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { lotSchema } from '#shared/schemas/lots';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths, type LotFilters } from '#src/lib/bank-api';

export const lotsPageSchema = z.object({ items: z.array(lotSchema), nextCursor: z.string().nullable() });
export type LotsPage = z.infer<typeof lotsPageSchema>;

/** Lots per page: enough for a home bank in one go, small enough to stay quick on a phone. */
export const LOTS_PAGE_SIZE = 50;

/** GET /api/banks/:bankId/lots?limit=&cursor=&q=&speciesId=&status= (ordered by code). */
export function getLots(
  bankId: string,
  filters: LotFilters & { cursor?: string | undefined; limit?: number },
  { signal }: { signal?: AbortSignal } = {},
): Promise<LotsPage> {
  const search = new URLSearchParams({ limit: String(filters.limit ?? LOTS_PAGE_SIZE) });
  if (filters.cursor) search.set('cursor', filters.cursor);
  if (filters.q) search.set('q', filters.q);
  if (filters.speciesId) search.set('speciesId', filters.speciesId);
  if (filters.status) search.set('status', filters.status);
  return apiFetch(`${bankPaths.lots(bankId)}?${search}`, { schema: lotsPageSchema, signal });
}

export function lotsQueryOptions(bankId: string, filters: LotFilters) {
  return infiniteQueryOptions({
    queryKey: bankKeys.lotList(bankId, filters),
    queryFn: ({ pageParam, signal }) => getLots(bankId, { ...filters, cursor: pageParam }, { signal }),
    initialPageParam: undefined as string | undefined,
    getNextPageParam: (last) => last.nextCursor ?? undefined,
  });
}

export function useLots(bankId: string, filters: LotFilters) {
  return useInfiniteQuery({ ...lotsQueryOptions(bankId, filters), placeholderData: (previous) => previous });
}
