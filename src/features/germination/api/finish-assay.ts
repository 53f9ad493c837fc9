import { useMutation, useQueryClient } from '@tanstack/react-query';
import { assayDetailSchema, type FinishBody, type AssayDetail } from '#shared/schemas/germination';
import { apiFetch } from '#src/lib/api-client';
import { applyAssayDetail } from './apply-assay-detail';
import { bankPaths } from '#src/lib/bank-api';

/**
 * POST /api/banks/:bankId/tests/:testId/finish (grower): closes the test with each tray's abnormal
 * and ungerminated seeds; 422 when a tray does not add up to its seeds sown.
 */
export function finishAssay(bankId: string, assayId: string, body: FinishBody): Promise<AssayDetail> {
  return apiFetch(bankPaths.assayFinish(bankId, assayId), {
    method: 'POST',
    body,
    schema: assayDetailSchema,
  });
}

export function useFinishAssay(bankId: string, assayId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: FinishBody) => finishAssay(bankId, assayId, body),
    onSuccess: (detail) => applyAssayDetail(queryClient, bankId, detail),
  });
}
