import { useMutation, useQueryClient } from '@tanstack/react-query';
import { assayDetailSchema, type CountsBody, type AssayDetail } from '#shared/schemas/germination';
import { apiFetch } from '#src/lib/api-client';
import { applyAssayDetail } from './apply-assay-detail';
import { bankPaths } from '#src/lib/bank-api';

/**
 * POST /api/banks/:bankId/tests/:testId/counts (grower): the cumulative normal seedlings of each tray
 * on one check date; posting a date again corrects it. 422 names every tray that does not fit.
 */
export function recordCounts(
  bankId: string,
  assayId: string,
  body: CountsBody,
  { signal }: { signal?: AbortSignal } = {},
): Promise<AssayDetail> {
  return apiFetch(bankPaths.assayCounts(bankId, assayId), {
    method: 'POST',
    body,
    schema: assayDetailSchema,
    signal,
  });
}

// A bench with weak Wi-Fi can leave a request hanging; give up after this and keep the numbers.
const SAVE_TIMEOUT_MS = 20_000;

export function useRecordCounts(bankId: string, assayId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CountsBody) =>
      recordCounts(bankId, assayId, body, { signal: AbortSignal.timeout(SAVE_TIMEOUT_MS) }),
    onSuccess: (detail) => applyAssayDetail(queryClient, bankId, detail),
  });
}
