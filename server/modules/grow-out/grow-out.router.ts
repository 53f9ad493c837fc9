import { Router } from 'express';
import { onQuerySchema } from '#shared/schemas/common';
import { growOutResponseSchema } from '#shared/schemas/seed-saving';
import { requireRole } from '#server/auth/bank-access';
import { parse } from '#server/http/errors';
import { respond } from '#server/http/respond';
import { bankOf } from '#server/http/request-context';
import type { ViabilityService } from '../viability/viability.service';
import type { GrowOutService } from './grow-out.service';

/** GET /api/banks/:bankId/grow-out?on=YYYY-MM-DD — the varieties to grow out for fresh seed. */
export function growOutRoutes(growOut: GrowOutService, viability: ViabilityService): Router {
  const router = Router({ mergeParams: true });
  router.get('/', requireRole('viewer'), async (req, res) => {
    const bankId = bankOf(req).id;
    const { on } = parse(onQuerySchema, req.query, 'query');
    respond(
      res,
      200,
      growOutResponseSchema,
      await growOut.list(bankId, on ?? (await viability.today(bankId))),
    );
  });
  return router;
}
