import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client';
import { apiPaths, bankKeys } from './keys';

/** DELETE /api/banks/:bankId/invitations/:invitationId (owner): the link stops working. */
export async function revokeInvitation(bankId: string, invitationId: string): Promise<void> {
  await apiFetch(apiPaths.invitation(bankId, invitationId), { method: 'DELETE' });
}

export function useRevokeInvitation(bankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: string) => revokeInvitation(bankId, invitationId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: bankKeys.invitations(bankId) }),
  });
}
