import { useMutation, useQueryClient, type UseMutationOptions } from '@tanstack/react-query';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

/** POST /api/banks/:bankId/leave: the caller leaves; 409 last_owner for the last owner. */
export async function leaveBank(bankId: string): Promise<void> {
  await apiFetch(bankPaths.leave(bankId), { method: 'POST' });
}

export function useLeaveBank(
  bankId: string,
  options: Pick<UseMutationOptions<void, Error, void>, 'onSuccess'> = {},
) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => leaveBank(bankId),
    onSuccess: async (...args) => {
      await options.onSuccess?.(...args);
      queryClient.removeQueries({ queryKey: bankKeys.bank(bankId) });
    },
  });
}
