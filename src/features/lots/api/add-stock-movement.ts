import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { movementSchema, type StockBody } from '#shared/schemas/lots';
import { apiFetch } from '#src/lib/api-client';
import { bankPaths, refresh, stale } from '#src/lib/bank-api';

const addedSchema = z.object({ movement: movementSchema, seedsOnHand: z.number().nullable() });

/** POST /api/banks/:bankId/lots/:lotId/stock (grower); 409 stock_below_zero, 422 for a future date. */
export function addStockMovement(bankId: string, lotId: string, body: StockBody) {
  return apiFetch(bankPaths.lotStock(bankId, lotId), { method: 'POST', body, schema: addedSchema });
}

export function useAddStockMovement(bankId: string, lotId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: StockBody) => addStockMovement(bankId, lotId, body),
    // The balance, the lot's seeds on hand and maybe its status all move.
    onSuccess: () => refresh(queryClient, stale.stockMoved(bankId, lotId)),
  });
}
