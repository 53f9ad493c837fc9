import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { movementSchema } from '#shared/schemas/lots';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

export const stockResponseSchema = z.object({
  items: z.array(movementSchema),
  seedsOnHand: z.number().nullable(),
});
export type StockResponse = z.infer<typeof stockResponseSchema>;

/** GET /api/banks/:bankId/lots/:lotId/stock: every movement, oldest first, with the running balance. */
export function getStock(bankId: string, lotId: string, { signal }: { signal?: AbortSignal } = {}) {
  return apiFetch(bankPaths.lotStock(bankId, lotId), { schema: stockResponseSchema, signal });
}

export function stockQueryOptions(bankId: string, lotId: string) {
  return queryOptions({
    queryKey: bankKeys.lotStock(bankId, lotId),
    queryFn: ({ signal }) => getStock(bankId, lotId, { signal }),
  });
}

export function useStock(bankId: string, lotId: string) {
  return useQuery(stockQueryOptions(bankId, lotId));
}
