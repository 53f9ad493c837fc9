import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { assaysImportPreviewSchema } from '#shared/schemas/germination';
import { apiFetch } from '#src/lib/api-client';
import { csvForm } from '#src/lib/csv-import';
import { bankPaths, refresh, stale } from '#src/lib/bank-api';

const importedSchema = z.object({ imported: z.number() });

/** POST /api/banks/:bankId/tests/import?dryRun=true: the tests the file would add, nothing written. */
export async function previewAssaysImport(bankId: string, file: File) {
  return (
    await apiFetch(bankPaths.assaysImport(bankId, true), {
      method: 'POST',
      body: csvForm(file),
      schema: assaysImportPreviewSchema,
    })
  ).preview;
}

/** POST /api/banks/:bankId/tests/import: every test in one transaction, or nothing. */
export async function importAssays(bankId: string, file: File) {
  return (
    await apiFetch(bankPaths.assaysImport(bankId, false), {
      method: 'POST',
      body: csvForm(file),
      schema: importedSchema,
    })
  ).imported;
}

export function usePreviewAssaysImport(bankId: string) {
  return useMutation({ mutationFn: (file: File) => previewAssaysImport(bankId, file) });
}

export function useImportAssays(bankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (file: File) => importAssays(bankId, file),
    // New tests of any lot (history: no seeds leave the stock) move every lot's projection.
    onSuccess: () => refresh(queryClient, stale.projections(bankId)),
  });
}
