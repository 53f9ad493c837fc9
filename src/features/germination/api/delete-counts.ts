import { useMutation, useQueryClient } from '@tanstack/react-query';
import { assayDetailSchema, type AssayDetail } from '#shared/schemas/germination';
import { apiFetch } from '#src/lib/api-client';
import { applyAssayDetail } from './apply-assay-detail';
import { bankPaths } from '#src/lib/bank-api';

/** DELETE /api/banks/:bankId/tests/:testId/counts/:date (grower): removes one check date's counts. */
export function deleteCounts(bankId: string, assayId: string, date: string): Promise<AssayDetail> {
  return apiFetch(bankPaths.assayCountsOn(bankId, assayId, date), {
    method: 'DELETE',
    schema: assayDetailSchema,
  });
}

export function useDeleteCounts(bankId: string, assayId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (date: string) => deleteCounts(bankId, assayId, date),
    onSuccess: (detail) => applyAssayDetail(queryClient, bankId, detail),
  });
}
