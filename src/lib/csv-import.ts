import { errorResponseSchema } from '#shared/schemas/common';
import { isApiError } from './api-client';

export type CsvRowProblem = { line: number; column?: string | undefined; message: string };

/** The failing rows of a refused import (400 invalid_csv), or none for any other failure. */
export function csvProblems(error: unknown): CsvRowProblem[] {
  if (!isApiError(error) || error.code !== 'invalid_csv') return [];
  const parsed = errorResponseSchema.safeParse(error.body);
  return parsed.success ? (parsed.data.error.rows ?? []) : [];
}

/** A multipart body with the file in the field `file`, as every CSV import route takes it. */
export function csvForm(file: File): FormData {
  const body = new FormData();
  body.append('file', file);
  return body;
}
