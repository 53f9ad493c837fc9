import { queryOptions, useQuery } from '@tanstack/react-query';
import { keepingTrueResponseSchema } from '#shared/schemas/seed-saving';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

/** GET /api/banks/:bankId/lots/:lotId/keeping-true: the plants saved from, isolation, warnings. */
export function getKeepingTrue(bankId: string, lotId: string, { signal }: { signal?: AbortSignal } = {}) {
  return apiFetch(bankPaths.lotKeepingTrue(bankId, lotId), { schema: keepingTrueResponseSchema, signal });
}

export function keepingTrueQueryOptions(bankId: string, lotId: string) {
  return queryOptions({
    queryKey: bankKeys.lotKeepingTrue(bankId, lotId),
    queryFn: ({ signal }) => getKeepingTrue(bankId, lotId, { signal }),
    // The lot's parents and plants bulked change on this page: read again whenever it opens.
    staleTime: 0,
  });
}

export function useKeepingTrue(bankId: string, lotId: string) {
  return useQuery(keepingTrueQueryOptions(bankId, lotId));
}
