import { Router } from 'express';
import { onQuerySchema } from '#shared/schemas/common';
import { overviewSchema } from '#shared/schemas/overview';
import { requireRole } from '#server/auth/bank-access';
import { bankToday, type Clock } from '#server/clock';
import type { Db } from '#server/db/database';
import { parse } from '#server/http/errors';
import { respond } from '#server/http/respond';
import type { ViabilityService } from '../viability/viability.service';
import { createOverviewService } from './overview.service';
import { bankOf } from '#server/http/request-context';

/** GET /api/banks/:bankId/overview — what needs doing this week. */
export function overviewRoutes(deps: { db: Db; clock: Clock; viability: ViabilityService }): Router {
  const overview = createOverviewService(deps);
  const router = Router({ mergeParams: true });
  router.get('/', requireRole('viewer'), async (req, res) => {
    const bankId = bankOf(req).id;
    const today =
      parse(onQuerySchema, req.query, 'query').on ?? (await bankToday(deps.db, deps.clock, bankId));
    respond(res, 200, overviewSchema, await overview.week(bankId, today));
  });
  return router;
}
