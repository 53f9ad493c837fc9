import { useMutation, useQueryClient, type UseMutationOptions } from '@tanstack/react-query';
import type { Role } from '#shared/schemas/accounts';
import { membersResponseSchema } from '#shared/schemas/banks';
import { apiFetch } from '#src/lib/api-client';
import type { MembersResponse } from './get-members';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

export interface UpdateMemberRoleInput {
  userId: string;
  role: Role;
}

/** PATCH /api/banks/:bankId/members/:userId (owner); 409 last_owner when it would leave no owner. */
export function updateMemberRole(
  bankId: string,
  { userId, role }: UpdateMemberRoleInput,
): Promise<MembersResponse> {
  return apiFetch(bankPaths.member(bankId, userId), {
    method: 'PATCH',
    body: { role },
    schema: membersResponseSchema,
  });
}

export function useUpdateMemberRole(
  bankId: string,
  options: Pick<UseMutationOptions<MembersResponse, Error, UpdateMemberRoleInput>, 'onSuccess'> = {},
) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateMemberRoleInput) => updateMemberRole(bankId, input),
    onSuccess: async (members, ...rest) => {
      queryClient.setQueryData(bankKeys.members(bankId), members);
      // The caller's own role may be the one that changed; the bank answer carries it.
      await queryClient.invalidateQueries({ queryKey: bankKeys.bank(bankId), exact: true });
      await options.onSuccess?.(members, ...rest);
    },
  });
}
