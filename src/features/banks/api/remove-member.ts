import { useMutation, useQueryClient, type UseMutationOptions } from '@tanstack/react-query';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

/** DELETE /api/banks/:bankId/members/:userId (owner); 409 last_owner for the last owner. */
export async function removeMember(bankId: string, userId: string): Promise<void> {
  await apiFetch(bankPaths.member(bankId, userId), { method: 'DELETE' });
}

export function useRemoveMember(
  bankId: string,
  options: Pick<UseMutationOptions<void, Error, string>, 'onSuccess'> = {},
) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (userId: string) => removeMember(bankId, userId),
    onSuccess: async (...args) => {
      await queryClient.invalidateQueries({ queryKey: bankKeys.members(bankId) });
      await options.onSuccess?.(...args);
    },
  });
}
