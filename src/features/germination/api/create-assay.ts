import { useMutation, useQueryClient } from '@tanstack/react-query';
import { assayDetailSchema, type CreateAssayBody, type AssayDetail } from '#shared/schemas/germination';
import { apiFetch } from '#src/lib/api-client';
import { applyAssayDetail } from './apply-assay-detail';
import { bankPaths } from '#src/lib/bank-api';

/**
 * POST /api/banks/:bankId/lots/:lotId/tests (grower): starts a test and withdraws its seeds from
 * the lot's stock. 409 stock_short when the ledger holds fewer seeds; 422 for a future start.
 */
export function createAssay(bankId: string, lotId: string, body: CreateAssayBody): Promise<AssayDetail> {
  return apiFetch(bankPaths.lotAssays(bankId, lotId), { method: 'POST', body, schema: assayDetailSchema });
}

export function useCreateAssay(bankId: string, lotId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateAssayBody) => createAssay(bankId, lotId, body),
    // The test's seeds leave the lot's stock.
    onSuccess: (detail) => applyAssayDetail(queryClient, bankId, detail, { stockMoved: true }),
  });
}
