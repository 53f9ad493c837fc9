import { Router } from 'express';
import { z } from 'zod';
import { assaysImportPreviewSchema } from '#shared/schemas/germination';
import { requireRole } from '#server/auth/bank-access';
import { csvFileText, csvUpload } from '#server/csv/csv-upload';
import { respond } from '#server/http/respond';
import type { AssaysCsvService } from './assays-csv.service';
import { authOf, bankOf } from '#server/http/request-context';

const importedSchema = z.object({ imported: z.number() });

/** GET /api/banks/:bankId/tests.csv */
export function assaysCsvExport(csv: AssaysCsvService): Router {
  const router = Router({ mergeParams: true });
  router.get('/', requireRole('viewer'), async (req, res) => {
    const text = await csv.exportCsv(bankOf(req).id);
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', 'attachment; filename="hilum-tests.csv"');
    res.send(text);
  });
  return router;
}

/** POST /api/banks/:bankId/tests/import (multipart `file`; `?dryRun=true` only checks it). */
export function assaysCsvImport(csv: AssaysCsvService): Router {
  const router = Router({ mergeParams: true });
  router.post('/', requireRole('grower'), csvUpload, async (req, res) => {
    const { dryRun, text } = csvFileText(req);
    const outcome = await csv.importCsv(bankOf(req).id, authOf(req).userId, text, { dryRun });
    respond(res, 200, z.union([assaysImportPreviewSchema, importedSchema]), outcome);
  });
  return router;
}
