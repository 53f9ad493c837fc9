import { useMutation, useQueryClient } from '@tanstack/react-query';
import { testDetailSchema, type TestDetail } from '#shared/schemas/germination';
import { apiFetch } from '#src/lib/api-client';
import { applyTestDetail } from './apply-test-detail';
import { bankPaths } from '#src/lib/bank-api';

/**
 * PATCH /api/banks/:bankId/tests/:testId/trays/:trayId (grower, running tests): sets a tray aside
 * with a reason (spilled, dried out), leaving it out of every figure, or takes it back (null).
 */
export function setTrayAside(
  bankId: string,
  testId: string,
  trayId: string,
  setAsideReason: string | null,
): Promise<TestDetail> {
  return apiFetch(bankPaths.tray(bankId, testId, trayId), {
    method: 'PATCH',
    body: { setAsideReason },
    schema: testDetailSchema,
  });
}

export function useSetTrayAside(bankId: string, testId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ trayId, reason }: { trayId: string; reason: string | null }) =>
      setTrayAside(bankId, testId, trayId, reason),
    onSuccess: (detail) => applyTestDetail(queryClient, bankId, detail),
  });
}
