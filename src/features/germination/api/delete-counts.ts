import { useMutation, useQueryClient } from '@tanstack/react-query';
import { testDetailSchema, type TestDetail } from '#shared/schemas/germination';
import { apiFetch } from '#src/lib/api-client';
import { applyTestDetail } from './apply-test-detail';
import { bankPaths } from '#src/lib/bank-api';

/** DELETE /api/banks/:bankId/tests/:testId/counts/:date (grower): removes one check date's counts. */
export function deleteCounts(bankId: string, testId: string, date: string): Promise<TestDetail> {
  return apiFetch(bankPaths.testCountsOn(bankId, testId, date), {
    method: 'DELETE',
    schema: testDetailSchema,
  });
}

export function useDeleteCounts(bankId: string, testId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (date: string) => deleteCounts(bankId, testId, date),
    onSuccess: (detail) => applyTestDetail(queryClient, bankId, detail),
  });
}
