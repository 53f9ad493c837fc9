import { useMutation, useQueryClient } from '@tanstack/react-query';
import { testDetailSchema, type TestDetail } from '#shared/schemas/germination';
import { apiFetch } from '#src/lib/api-client';
import { applyTestDetail } from './apply-test-detail';
import { bankPaths } from '#src/lib/bank-api';

/**
 * POST /api/banks/:bankId/tests/:testId/set-aside (grower, running or finished tests): sets the whole
 * test aside with a reason (mouldy towel, too cold), so it leaves the lot's decline and advice while
 * staying in its history, or takes it back (null).
 */
export function setTestAside(bankId: string, testId: string, reason: string | null): Promise<TestDetail> {
  return apiFetch(bankPaths.testSetAside(bankId, testId), {
    method: 'POST',
    body: { reason },
    schema: testDetailSchema,
  });
}

export function useSetTestAside(bankId: string, testId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (reason: string | null) => setTestAside(bankId, testId, reason),
    // The lots' queries hold the decline, the advice and the ranking: they refresh with it.
    onSuccess: (detail) => applyTestDetail(queryClient, bankId, detail),
  });
}
