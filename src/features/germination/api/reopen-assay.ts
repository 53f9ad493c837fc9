import { useMutation, useQueryClient } from '@tanstack/react-query';
import { assayDetailSchema, type AssayDetail } from '#shared/schemas/germination';
import { apiFetch } from '#src/lib/api-client';
import { applyAssayDetail } from './apply-assay-detail';
import { bankPaths } from '#src/lib/bank-api';

/** POST /api/banks/:bankId/tests/:testId/reopen (grower): a finished test takes counts again. */
export function reopenAssay(bankId: string, assayId: string): Promise<AssayDetail> {
  return apiFetch(bankPaths.assayReopen(bankId, assayId), { method: 'POST', schema: assayDetailSchema });
}

export function useReopenAssay(bankId: string, assayId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => reopenAssay(bankId, assayId),
    onSuccess: (detail) => applyAssayDetail(queryClient, bankId, detail),
  });
}
