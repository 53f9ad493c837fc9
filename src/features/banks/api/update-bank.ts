import { useMutation, useQueryClient, type UseMutationOptions } from '@tanstack/react-query';
import { bankResponseSchema, type UpdateBankBody } from '#shared/schemas/banks';
import { apiFetch } from '#src/lib/api-client';
import type { BankResponse } from './get-bank';
import { bankKeys, bankPaths, refresh, stale } from '#src/lib/bank-api';

/** PATCH /api/banks/:bankId (owner). */
export function updateBank(bankId: string, body: UpdateBankBody): Promise<BankResponse> {
  return apiFetch(bankPaths.bank(bankId), { method: 'PATCH', body, schema: bankResponseSchema });
}

export function useUpdateBank(
  bankId: string,
  options: Pick<UseMutationOptions<BankResponse, Error, UpdateBankBody>, 'onSuccess'> = {},
) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: UpdateBankBody) => updateBank(bankId, body),
    onSuccess: async (response, ...rest) => {
      queryClient.setQueryData(bankKeys.bank(bankId), response);
      // Frost dates, time zone and assurance feed every projection, the plan's dates and the overview.
      await refresh(queryClient, stale.projections(bankId));
      await options.onSuccess?.(response, ...rest);
    },
  });
}
