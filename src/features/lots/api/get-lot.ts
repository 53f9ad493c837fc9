import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { lotSchema } from '#shared/schemas/lots';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

export const lotResponseSchema = z.object({ lot: lotSchema });

/** GET /api/banks/:bankId/lots/:lotId */
export async function getLot(bankId: string, lotId: string, { signal }: { signal?: AbortSignal } = {}) {
  return (await apiFetch(bankPaths.lot(bankId, lotId), { schema: lotResponseSchema, signal })).lot;
}

export function lotQueryOptions(bankId: string, lotId: string) {
  return queryOptions({
    queryKey: bankKeys.lot(bankId, lotId),
    queryFn: ({ signal }) => getLot(bankId, lotId, { signal }),
  });
}

/** The lot of a page whose loader has fetched it. */
export function useLot(bankId: string, lotId: string) {
  return useSuspenseQuery(lotQueryOptions(bankId, lotId));
}
