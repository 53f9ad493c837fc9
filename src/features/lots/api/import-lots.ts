import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { errorResponseSchema } from '../../../../shared/schemas/common';
import { apiFetch, isApiError } from '../../../lib/api-client';
import { lotApiPaths, lotKeys } from './keys';

export const importPreviewSchema = z.object({
  preview: z.array(
    z.object({
      line: z.number(),
      code: z.string().nullable(),
      species: z.string(),
      variety: z.string(),
      seedsOnHand: z.number(),
      harvestDate: z.string().nullable(),
      packedForSeason: z.number().nullable(),
      treated: z.boolean(),
    }),
  ),
});
export type ImportPreview = z.infer<typeof importPreviewSchema>['preview'];
const importedSchema = z.object({ imported: z.number() });

export type CsvRowProblem = { line: number; column?: string | undefined; message: string };

/** The failing rows of a refused import (400 invalid_csv), or none for any other failure. */
export function csvProblems(error: unknown): CsvRowProblem[] {
  if (!isApiError(error) || error.code !== 'invalid_csv') return [];
  const parsed = errorResponseSchema.safeParse(error.body);
  return parsed.success ? (parsed.data.error.rows ?? []) : [];
}

const formOf = (file: File) => {
  const body = new FormData();
  body.append('file', file);
  return body;
};

/** POST /api/banks/:bankId/lots/import?dryRun=true: what would be imported, nothing written. */
export async function previewLotsImport(bankId: string, file: File) {
  return (await apiFetch(lotApiPaths.import(bankId, true), { method: 'POST', body: formOf(file), schema: importPreviewSchema })).preview;
}

/** POST /api/banks/:bankId/lots/import: every row in one transaction, or nothing. */
export async function importLots(bankId: string, file: File) {
  return (await apiFetch(lotApiPaths.import(bankId, false), { method: 'POST', body: formOf(file), schema: importedSchema })).imported;
}

export function usePreviewLotsImport(bankId: string) {
  return useMutation({ mutationFn: (file: File) => previewLotsImport(bankId, file) });
}

export function useImportLots(bankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (file: File) => importLots(bankId, file),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: lotKeys.all(bankId) }),
  });
}
