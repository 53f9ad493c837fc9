import { useMutation, useQueryClient } from '@tanstack/react-query';
import { assayDetailSchema, type CountsBody, type AssayDetail } from '#shared/schemas/germination';
import { submitWrite } from '#src/lib/write-queue';
import { applyAssayDetail } from './apply-assay-detail';
import { bankPaths } from '#src/lib/bank-api';

/** What the write queue files a test's counts under, so its page finds those waiting to send. */
export const assayWriteSubject = (assayId: string) => `test:${assayId}`;

/**
 * POST /api/banks/:bankId/tests/:testId/counts (grower): the cumulative normal seedlings of each tray
 * on one check date; posting a date again corrects it. 422 names every tray that does not fit.
 * Saved through the device's write queue: sent at once when there is a network, else kept
 * on this device and sent when it returns (src/lib/write-queue.ts). Resolves with the test's new
 * state when sent, or null when the counts wait to send; a refusal (422) rejects as before.
 */
export function useRecordCounts(bankId: string, assayId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    // Runs offline too (TanStack Query would pause it): the write queue keeps what cannot go yet.
    networkMode: 'always',
    mutationFn: async ({ body, label }: { body: CountsBody; label: string }): Promise<AssayDetail | null> => {
      const result = await submitWrite({
        bankId,
        subject: assayWriteSubject(assayId),
        label,
        path: bankPaths.assayCounts(bankId, assayId),
        body,
      });
      return result.sent ? assayDetailSchema.parse(result.answer) : null;
    },
    onSuccess: (detail) => (detail ? applyAssayDetail(queryClient, bankId, detail) : undefined),
  });
}
