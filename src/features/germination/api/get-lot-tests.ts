import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { testDetailSchema } from '#shared/schemas/germination';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

export const lotTestsResponseSchema = z.object({ items: z.array(testDetailSchema) });
export type LotTestsResponse = z.infer<typeof lotTestsResponseSchema>;

/** GET /api/banks/:bankId/lots/:lotId/tests: every test of one lot, newest first. */
export function getLotTests(
  bankId: string,
  lotId: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<LotTestsResponse> {
  return apiFetch(bankPaths.lotTests(bankId, lotId), { schema: lotTestsResponseSchema, signal });
}

export function lotTestsQueryOptions(bankId: string, lotId: string) {
  return queryOptions({
    queryKey: bankKeys.lotTests(bankId, lotId),
    queryFn: ({ signal }) => getLotTests(bankId, lotId, { signal }),
  });
}

export function useLotTests(bankId: string, lotId: string) {
  return useQuery(lotTestsQueryOptions(bankId, lotId));
}
