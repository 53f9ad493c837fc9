import { useMutation, useQueryClient } from '@tanstack/react-query';
import { assayDetailSchema, type AssayDetail } from '#shared/schemas/germination';
import { apiFetch } from '#src/lib/api-client';
import { applyAssayDetail } from './apply-assay-detail';
import { bankPaths } from '#src/lib/bank-api';

/**
 * POST /api/banks/:bankId/tests/:testId/set-aside (grower, running or finished tests): sets the whole
 * test aside with a reason (mouldy towel, too cold), so it leaves the lot's decline and advice while
 * staying in its history, or takes it back (null).
 */
export function setAssayAside(bankId: string, assayId: string, reason: string | null): Promise<AssayDetail> {
  return apiFetch(bankPaths.assaySetAside(bankId, assayId), {
    method: 'POST',
    body: { reason },
    schema: assayDetailSchema,
  });
}

export function useSetAssayAside(bankId: string, assayId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (reason: string | null) => setAssayAside(bankId, assayId, reason),
    // The lots' queries hold the decline, the advice and the ranking: they refresh with it.
    onSuccess: (detail) => applyAssayDetail(queryClient, bankId, detail),
  });
}
