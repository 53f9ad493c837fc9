import { useMutation, useQueryClient } from '@tanstack/react-query';
import { emergenceResponseSchema, type EmergenceBody } from '#shared/schemas/plan';
import { bankPaths, refresh, stale } from '#src/lib/bank-api';
import { submitWrite } from '#src/lib/write-queue';
import { putEntry } from './invalidate-plan';

/** What the write queue files a sowing's emergence under, so its card finds those waiting to send. */
export const planEntryWriteSubject = (entryId: string) => `plan-entry:${entryId}`;

/**
 * POST /api/banks/:bankId/plan/:entryId/emergence { date, seedlings? | score? } (grower): what came
 * up from a sowing. 409 when the entry is not marked sown; 422 for a date before the sowing or in
 * the future, or more seedlings than seeds sown. Saved through the device's write queue
 * (src/lib/write-queue.ts): resolves true when sent, false when it waits on this device to be sent
 * when the network is back; a refusal rejects as before.
 */
export function useRecordEmergence(bankId: string, entryId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    // Runs offline too (TanStack Query would pause it): the write queue keeps what cannot go yet.
    networkMode: 'always',
    mutationFn: async ({ body, label }: { body: EmergenceBody; label: string }) => {
      const result = await submitWrite({
        bankId,
        subject: planEntryWriteSubject(entryId),
        label,
        path: bankPaths.planEmergence(bankId, entryId),
        body,
      });
      return result.sent ? emergenceResponseSchema.parse(result.answer) : null;
    },
    onSuccess: async (answer) => {
      if (!answer) return;
      const { entry } = answer;
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
