import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { invitationSchema, type CreateInvitationBody, type InvitationDto } from '#shared/schemas/banks';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

const createInvitationResponseSchema = z.object({ invitation: invitationSchema });

/** POST /api/banks/:bankId/invitations (owner): e-mails a link; 409 already_member. */
export async function createInvitation(bankId: string, body: CreateInvitationBody): Promise<InvitationDto> {
  const response = await apiFetch(bankPaths.invitations(bankId), {
    method: 'POST',
    body,
    schema: createInvitationResponseSchema,
  });
  return response.invitation;
}

export function useCreateInvitation(bankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateInvitationBody) => createInvitation(bankId, body),
    // A new invitation to the same address replaces the open one, so read the list again.
    onSuccess: () => queryClient.invalidateQueries({ queryKey: bankKeys.invitations(bankId) }),
  });
}
