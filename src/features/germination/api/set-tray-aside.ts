import { useMutation, useQueryClient } from '@tanstack/react-query';
import { assayDetailSchema, type AssayDetail } from '#shared/schemas/germination';
import { apiFetch } from '#src/lib/api-client';
import { applyAssayDetail } from './apply-assay-detail';
import { bankPaths } from '#src/lib/bank-api';

/**
 * PATCH /api/banks/:bankId/tests/:testId/trays/:trayId (grower, running tests): sets a tray aside
 * with a reason (spilled, dried out), leaving it out of every figure, or takes it back (null).
 */
export function setTrayAside(
  bankId: string,
  assayId: string,
  trayId: string,
  setAsideReason: string | null,
): Promise<AssayDetail> {
  return apiFetch(bankPaths.tray(bankId, assayId, trayId), {
    method: 'PATCH',
    body: { setAsideReason },
    schema: assayDetailSchema,
  });
}

export function useSetTrayAside(bankId: string, assayId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ trayId, reason }: { trayId: string; reason: string | null }) =>
      setTrayAside(bankId, assayId, trayId, reason),
    onSuccess: (detail) => applyAssayDetail(queryClient, bankId, detail),
  });
}
