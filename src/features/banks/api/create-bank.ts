import { useMutation, useQueryClient, type UseMutationOptions } from '@tanstack/react-query';
import { z } from 'zod';
import { bankSchema, type BankDto, type CreateBankBody } from '#shared/schemas/banks';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys } from '#src/lib/bank-api';

const createBankResponseSchema = z.object({ bank: bankSchema });

/** POST /api/banks: the caller becomes the new bank's owner. */
export async function createBank(body: CreateBankBody): Promise<BankDto> {
  return (await apiFetch('/api/banks', { method: 'POST', body, schema: createBankResponseSchema })).bank;
}

export function useCreateBank(
  options: Pick<UseMutationOptions<BankDto, Error, CreateBankBody>, 'onSuccess'> = {},
) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createBank,
    onSuccess: async (bank, ...rest) => {
      queryClient.setQueryData(bankKeys.bank(bank.id), { bank, role: 'owner' as const });
      await options.onSuccess?.(bank, ...rest);
    },
  });
}
