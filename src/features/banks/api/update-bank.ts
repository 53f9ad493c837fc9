import { useMutation, useQueryClient, type UseMutationOptions } from '@tanstack/react-query';
import type { z } from 'zod';
import { bankUpdateResponseSchema, type UpdateBankBody } from '#shared/schemas/banks';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths, refresh, stale } from '#src/lib/bank-api';

export type BankUpdateResponse = z.infer<typeof bankUpdateResponseSchema>;

/** PATCH /api/banks/:bankId (owner): the bank, and the unsown sowings a moved last frost moved. */
export function updateBank(bankId: string, body: UpdateBankBody): Promise<BankUpdateResponse> {
  return apiFetch(bankPaths.bank(bankId), { method: 'PATCH', body, schema: bankUpdateResponseSchema });
}

export function useUpdateBank(
  bankId: string,
  options: Pick<UseMutationOptions<BankUpdateResponse, Error, UpdateBankBody>, 'onSuccess'> = {},
) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: UpdateBankBody) => updateBank(bankId, body),
    onSuccess: async (response, ...rest) => {
      queryClient.setQueryData(bankKeys.bank(bankId), { bank: response.bank, role: response.role });
      // Frost dates, time zone and assurance feed every projection, the plan's dates and the overview.
      await refresh(queryClient, stale.projections(bankId));
      await options.onSuccess?.(response, ...rest);
    },
  });
}
