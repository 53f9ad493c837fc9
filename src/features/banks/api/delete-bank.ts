import { useMutation, useQueryClient, type UseMutationOptions } from '@tanstack/react-query';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

/** DELETE /api/banks/:bankId (owner): the bank and everything in it. */
export async function deleteBank(bankId: string): Promise<void> {
  await apiFetch(bankPaths.bank(bankId), { method: 'DELETE' });
}

export function useDeleteBank(
  bankId: string,
  options: Pick<UseMutationOptions<void, Error, void>, 'onSuccess'> = {},
) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => deleteBank(bankId),
    onSuccess: async (...args) => {
      // The caller moves away first; only then is the bank's data dropped, so no page refetches it.
      await options.onSuccess?.(...args);
      queryClient.removeQueries({ queryKey: bankKeys.bank(bankId) });
    },
  });
}
