import { queryOptions, useQuery } from '@tanstack/react-query';
import type { z } from 'zod';
import { bankResponseSchema } from '#shared/schemas/banks';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

export type BankResponse = z.infer<typeof bankResponseSchema>;

/** GET /api/banks/:bankId: the bank and the caller's role in it (404 for a non-member). */
export function getBank(bankId: string, { signal }: { signal?: AbortSignal } = {}): Promise<BankResponse> {
  return apiFetch(bankPaths.bank(bankId), { schema: bankResponseSchema, signal });
}

export function bankQueryOptions(bankId: string) {
  return queryOptions({
    queryKey: bankKeys.bank(bankId),
    queryFn: ({ signal }) => getBank(bankId, { signal }),
  });
}

export function useBank(bankId: string) {
  return useQuery(bankQueryOptions(bankId));
}
