import { useMutation, useQueryClient } from '@tanstack/react-query';
import { emergenceResponseSchema, type EmergenceBody } from '#shared/schemas/plan';
import { apiFetch } from '#src/lib/api-client';
import { bankPaths, refresh, stale } from '#src/lib/bank-api';
import { putEntry } from './invalidate-plan';

/**
 * POST /api/banks/:bankId/plan/:entryId/emergence { date, seedlings? | score? } (grower): what came
 * up from a sowing. 409 when the entry is not marked sown; 422 for a date before the sowing or in
 * the future, or more seedlings than seeds sown.
 */
export async function recordEmergence(bankId: string, entryId: string, body: EmergenceBody) {
  return apiFetch(bankPaths.planEmergence(bankId, entryId), {
    method: 'POST',
    body,
    schema: emergenceResponseSchema,
  });
}

export function useRecordEmergence(bankId: string, entryId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: EmergenceBody) => recordEmergence(bankId, entryId, body),
    onSuccess: async ({ entry }) => {
      putEntry(queryClient, bankId, entry);
      // The lot's history and viability read it, and everything derived from its projection.
      await refresh(
        queryClient,
        stale.plan(bankId),
        entry.lotId ? stale.germination(bankId, entry.lotId) : [],
      );
    },
  });
}
