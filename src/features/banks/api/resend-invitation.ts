import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { invitationSchema, type InvitationDto } from '#shared/schemas/banks';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

const resendResponseSchema = z.object({ invitation: invitationSchema });

/** POST /api/banks/:bankId/invitations/:invitationId/resend (owner): a new link; the old one stops working. */
export async function resendInvitation(bankId: string, invitationId: string): Promise<InvitationDto> {
  const { invitation } = await apiFetch(`${bankPaths.invitation(bankId, invitationId)}/resend`, {
    method: 'POST',
    schema: resendResponseSchema,
  });
  return invitation;
}

export function useResendInvitation(bankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: string) => resendInvitation(bankId, invitationId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: bankKeys.invitations(bankId) }),
  });
}
