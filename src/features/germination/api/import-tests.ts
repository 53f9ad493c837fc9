import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { testsImportPreviewSchema } from '../../../../shared/schemas/germination';
import { apiFetch } from '../../../lib/api-client';
import { csvForm } from '../../../lib/csv-import';
import { apiPaths, germinationKeys } from './keys';

const importedSchema = z.object({ imported: z.number() });

/** POST /api/banks/:bankId/tests/import?dryRun=true: the tests the file would add, nothing written. */
export async function previewTestsImport(bankId: string, file: File) {
  return (await apiFetch(apiPaths.testsImport(bankId, true), { method: 'POST', body: csvForm(file), schema: testsImportPreviewSchema })).preview;
}

/** POST /api/banks/:bankId/tests/import: every test in one transaction, or nothing. */
export async function importTests(bankId: string, file: File) {
  return (await apiFetch(apiPaths.testsImport(bankId, false), { method: 'POST', body: csvForm(file), schema: importedSchema })).imported;
}

export function usePreviewTestsImport(bankId: string) {
  return useMutation({ mutationFn: (file: File) => previewTestsImport(bankId, file) });
}

export function useImportTests(bankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (file: File) => importTests(bankId, file),
    // New tests change lots' results, the ranking and the overview: refresh the whole bank.
    onSuccess: () => queryClient.invalidateQueries({ queryKey: germinationKeys.bank(bankId) }),
  });
}
