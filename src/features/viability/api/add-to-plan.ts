import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { planEntrySchema, type CreatePlanBody } from '#shared/schemas/plan';
import { apiFetch } from '#src/lib/api-client';
import { bankPaths, refresh, stale } from '#src/lib/bank-api';

const createdSchema = z.object({ entry: planEntrySchema });

/** POST /api/banks/:bankId/plan (grower): a sowing-plan entry for this lot's species, with the lot chosen. */
export async function addToPlan(bankId: string, body: CreatePlanBody) {
  return (await apiFetch(bankPaths.plan(bankId), { method: 'POST', body, schema: createdSchema })).entry;
}

export function useAddToPlan(bankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreatePlanBody) => addToPlan(bankId, body),
    onSuccess: () => refresh(queryClient, stale.plan(bankId)),
  });
}
