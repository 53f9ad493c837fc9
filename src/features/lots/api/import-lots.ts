import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { apiFetch } from '#src/lib/api-client';
import { csvForm } from '#src/lib/csv-import';
import { bankPaths, refresh, stale } from '#src/lib/bank-api';
import { lotsImportPreviewSchema, type LotsImportPreview } from '#shared/schemas/lots';

export type ImportPreview = LotsImportPreview;
const importedSchema = z.object({ imported: z.number() });

/** POST /api/banks/:bankId/lots/import?dryRun=true: what would be imported, nothing written. */
export async function previewLotsImport(bankId: string, file: File) {
  return (
    await apiFetch(bankPaths.lotsImport(bankId, true), {
      method: 'POST',
      body: csvForm(file),
      schema: lotsImportPreviewSchema,
    })
  ).preview;
}

/** POST /api/banks/:bankId/lots/import: every row in one transaction, or nothing. */
export async function importLots(bankId: string, file: File) {
  return (
    await apiFetch(bankPaths.lotsImport(bankId, false), {
      method: 'POST',
      body: csvForm(file),
      schema: importedSchema,
    })
  ).imported;
}

export function usePreviewLotsImport(bankId: string) {
  return useMutation({ mutationFn: (file: File) => previewLotsImport(bankId, file) });
}

export function useImportLots(bankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (file: File) => importLots(bankId, file),
    onSuccess: () => refresh(queryClient, stale.lotsAddedOrRemoved(bankId)),
  });
}
