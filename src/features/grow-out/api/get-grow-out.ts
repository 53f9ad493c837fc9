import { queryOptions, useQuery } from '@tanstack/react-query';
import { growOutResponseSchema } from '#shared/schemas/seed-saving';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

/** GET /api/banks/:bankId/grow-out: the varieties the advice calls grow-out, for today. */
export function getGrowOut(bankId: string, { signal }: { signal?: AbortSignal } = {}) {
  return apiFetch(bankPaths.growOut(bankId), { schema: growOutResponseSchema, signal });
}

export function growOutQueryOptions(bankId: string) {
  return queryOptions({
    queryKey: bankKeys.growOut(bankId),
    queryFn: ({ signal }) => getGrowOut(bankId, { signal }),
  });
}

export function useGrowOut(bankId: string) {
  return useQuery(growOutQueryOptions(bankId));
}
