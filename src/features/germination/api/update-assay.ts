import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { assayDetailSchema, type AssayDetail, type updateAssayBodySchema } from '#shared/schemas/germination';
import { apiFetch } from '#src/lib/api-client';
import { bankPaths } from '#src/lib/bank-api';
import { applyAssayDetail } from './apply-assay-detail';

export type UpdateAssayBody = z.infer<typeof updateAssayBodySchema>;

/**
 * PATCH /api/banks/:bankId/tests/:testId (grower, running tests): changes the test's setup, or
 * hands it to another owner or grower (`runnerId`), whom its check-day reminders then go to.
 */
export function updateAssay(bankId: string, assayId: string, body: UpdateAssayBody): Promise<AssayDetail> {
  return apiFetch(bankPaths.assay(bankId, assayId), { method: 'PATCH', body, schema: assayDetailSchema });
}

export function useUpdateAssay(bankId: string, assayId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: UpdateAssayBody) => updateAssay(bankId, assayId, body),
    onSuccess: (detail) => applyAssayDetail(queryClient, bankId, detail),
  });
}
