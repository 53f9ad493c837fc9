import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

/** DELETE /api/banks/:bankId/invitations/:invitationId (owner): the link stops working. */
export async function revokeInvitation(bankId: string, invitationId: string): Promise<void> {
  await apiFetch(bankPaths.invitation(bankId, invitationId), { method: 'DELETE' });
}

export function useRevokeInvitation(bankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: string) => revokeInvitation(bankId, invitationId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: bankKeys.invitations(bankId) }),
  });
}
