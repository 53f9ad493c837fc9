import { useMutation, useQueryClient } from '@tanstack/react-query';
import { testDetailSchema, type CountsBody, type TestDetail } from '#shared/schemas/germination';
import { apiFetch } from '#src/lib/api-client';
import { applyTestDetail } from './apply-test-detail';
import { bankPaths } from '#src/lib/bank-api';

/**
 * POST /api/banks/:bankId/tests/:testId/counts (grower): the cumulative normal seedlings of each tray
 * on one check date; posting a date again corrects it. 422 names every tray that does not fit.
 */
export function recordCounts(
  bankId: string,
  testId: string,
  body: CountsBody,
  { signal }: { signal?: AbortSignal } = {},
): Promise<TestDetail> {
  return apiFetch(bankPaths.testCounts(bankId, testId), {
    method: 'POST',
    body,
    schema: testDetailSchema,
    signal,
  });
}

// A bench with weak Wi-Fi can leave a request hanging; give up after this and keep the numbers.
const SAVE_TIMEOUT_MS = 20_000;

export function useRecordCounts(bankId: string, testId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CountsBody) =>
      recordCounts(bankId, testId, body, { signal: AbortSignal.timeout(SAVE_TIMEOUT_MS) }),
    onSuccess: (detail) => applyTestDetail(queryClient, bankId, detail),
  });
}
