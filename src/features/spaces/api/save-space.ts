import { useMutation, useQueryClient } from '@tanstack/react-query';
import { spaceEnvelopeSchema, type CreateSpaceBody, type UpdateSpaceBody } from '#shared/schemas/spaces';
import { apiFetch } from '#src/lib/api-client';
import { bankPaths, refresh, stale } from '#src/lib/bank-api';

/** POST /api/banks/:bankId/spaces (grower) → 201; 409 duplicate_space for a name the bank has. */
export async function createSpace(bankId: string, body: CreateSpaceBody) {
  return (await apiFetch(bankPaths.spaces(bankId), { method: 'POST', body, schema: spaceEnvelopeSchema }))
    .space;
}

/** PATCH /api/banks/:bankId/spaces/:spaceId (grower). */
export async function updateSpace(bankId: string, spaceId: string, body: UpdateSpaceBody) {
  return (
    await apiFetch(bankPaths.space(bankId, spaceId), { method: 'PATCH', body, schema: spaceEnvelopeSchema })
  ).space;
}

/** DELETE /api/banks/:bankId/spaces/:spaceId (grower) → 204. */
export async function deleteSpace(bankId: string, spaceId: string): Promise<void> {
  await apiFetch(bankPaths.space(bankId, spaceId), { method: 'DELETE' });
}

/** Adds a space, or changes the one named, then refreshes the spaces and the plan's room. */
export function useSaveSpace(bankId: string, spaceId?: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateSpaceBody) =>
      spaceId ? updateSpace(bankId, spaceId, body) : createSpace(bankId, body),
    onSuccess: () => refresh(queryClient, stale.spaces(bankId)),
  });
}

export function useDeleteSpace(bankId: string, spaceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => deleteSpace(bankId, spaceId),
    onSuccess: () => refresh(queryClient, stale.spaces(bankId)),
  });
}
