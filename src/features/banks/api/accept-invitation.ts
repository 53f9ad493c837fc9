import { useMutation, type UseMutationOptions } from '@tanstack/react-query';
import type { z } from 'zod';
import { acceptInvitationResponseSchema } from '#shared/schemas/banks';
import { apiFetch } from '#src/lib/api-client';

export type AcceptInvitationResponse = z.infer<typeof acceptInvitationResponseSchema>;

/** POST /api/invitations/accept (signed in): 400 invalid_token when used or expired, 409 already_member. */
export function acceptInvitation(token: string): Promise<AcceptInvitationResponse> {
  return apiFetch('/api/invitations/accept', {
    method: 'POST',
    body: { token },
    schema: acceptInvitationResponseSchema,
  });
}

export function useAcceptInvitation(
  options: Pick<UseMutationOptions<AcceptInvitationResponse, Error, string>, 'onSuccess'> = {},
) {
  return useMutation({ mutationFn: acceptInvitation, onSuccess: options.onSuccess });
}
