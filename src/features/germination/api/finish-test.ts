import { useMutation, useQueryClient } from '@tanstack/react-query';
import { testDetailSchema, type FinishBody, type TestDetail } from '#shared/schemas/germination';
import { apiFetch } from '#src/lib/api-client';
import { applyTestDetail } from './apply-test-detail';
import { bankPaths } from '#src/lib/bank-api';

/**
 * POST /api/banks/:bankId/tests/:testId/finish (grower): closes the test with each tray's abnormal
 * and ungerminated seeds; 422 when a tray does not add up to its seeds sown.
 */
export function finishTest(bankId: string, testId: string, body: FinishBody): Promise<TestDetail> {
  return apiFetch(bankPaths.testFinish(bankId, testId), { method: 'POST', body, schema: testDetailSchema });
}

export function useFinishTest(bankId: string, testId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: FinishBody) => finishTest(bankId, testId, body),
    onSuccess: (detail) => applyTestDetail(queryClient, bankId, detail),
  });
}
