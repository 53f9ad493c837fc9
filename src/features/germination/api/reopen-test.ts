import { useMutation, useQueryClient } from '@tanstack/react-query';
import { testDetailSchema, type TestDetail } from '#shared/schemas/germination';
import { apiFetch } from '#src/lib/api-client';
import { applyTestDetail } from './apply-test-detail';
import { bankPaths } from '#src/lib/bank-api';

/** POST /api/banks/:bankId/tests/:testId/reopen (grower): a finished test takes counts again. */
export function reopenTest(bankId: string, testId: string): Promise<TestDetail> {
  return apiFetch(bankPaths.testReopen(bankId, testId), { method: 'POST', schema: testDetailSchema });
}

export function useReopenTest(bankId: string, testId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => reopenTest(bankId, testId),
    onSuccess: (detail) => applyTestDetail(queryClient, bankId, detail),
  });
}
