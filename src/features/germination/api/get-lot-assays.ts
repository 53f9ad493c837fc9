import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { assayDetailSchema } from '#shared/schemas/germination';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

export const lotAssaysResponseSchema = z.object({ items: z.array(assayDetailSchema) });
export type LotAssaysResponse = z.infer<typeof lotAssaysResponseSchema>;

/** GET /api/banks/:bankId/lots/:lotId/tests: every test of one lot, newest first. */
export function getLotAssays(
  bankId: string,
  lotId: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<LotAssaysResponse> {
  return apiFetch(bankPaths.lotAssays(bankId, lotId), { schema: lotAssaysResponseSchema, signal });
}

export function lotAssaysQueryOptions(bankId: string, lotId: string) {
  return queryOptions({
    queryKey: bankKeys.lotAssays(bankId, lotId),
    queryFn: ({ signal }) => getLotAssays(bankId, lotId, { signal }),
  });
}

export function useLotAssays(bankId: string, lotId: string) {
  return useQuery(lotAssaysQueryOptions(bankId, lotId));
}
