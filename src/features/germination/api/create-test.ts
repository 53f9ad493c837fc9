import { useMutation, useQueryClient } from '@tanstack/react-query';
import { testDetailSchema, type CreateTestBody, type TestDetail } from '#shared/schemas/germination';
import { apiFetch } from '#src/lib/api-client';
import { applyTestDetail } from './apply-test-detail';
import { bankPaths } from '#src/lib/bank-api';

/**
 * POST /api/banks/:bankId/lots/:lotId/tests (grower): starts a test and withdraws its seeds from
 * the lot's stock. 409 stock_short when the ledger holds fewer seeds; 422 for a future start.
 */
export function createTest(bankId: string, lotId: string, body: CreateTestBody): Promise<TestDetail> {
  return apiFetch(bankPaths.lotTests(bankId, lotId), { method: 'POST', body, schema: testDetailSchema });
}

export function useCreateTest(bankId: string, lotId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateTestBody) => createTest(bankId, lotId, body),
    // The test's seeds leave the lot's stock.
    onSuccess: (detail) => applyTestDetail(queryClient, bankId, detail, { stockMoved: true }),
  });
}
