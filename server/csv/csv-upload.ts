import type { Request } from 'express';
import multer from 'multer';
import { csvImportQuerySchema } from '#shared/schemas/common';
import { badRequest, parse } from '../http/errors';
import { receiveFile } from '../http/multipart';

/** One CSV file in the multipart field `file`, up to 5 MB, kept in memory. */
export const csvUpload = receiveFile(
  multer({ storage: multer.memoryStorage(), limits: { fileSize: 5 * 1024 * 1024, files: 1 } }),
  'file',
);

/** The uploaded file's text and whether the caller only wants to see what it would import. */
export function csvFileText(req: Request): { dryRun: boolean; text: string } {
  const { dryRun } = parse(csvImportQuerySchema, req.query, 'query');
  if (!req.file) throw badRequest('Choose a CSV file to import.', { file: 'Choose a CSV file.' });
  return { dryRun, text: req.file.buffer.toString('utf8') };
}
