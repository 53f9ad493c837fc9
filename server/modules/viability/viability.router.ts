import { Router } from 'express';
import { onQuerySchema } from '#shared/schemas/common';
import {
  rankingItemSchema,
  seedsToSowQuerySchema,
  seedsToSowResponseSchema,
  viabilityResponseSchema,
} from '#shared/schemas/viability';
import { requireRole } from '#server/auth/bank-access';
import { parse } from '#server/http/errors';
import { idParam } from '#server/http/params';
import { respond, respondRendered, rowRenderer } from '#server/http/respond';
import type { ViabilityService } from './viability.service';
import { bankOf } from '#server/http/request-context';

export function viabilityRoutes(service: ViabilityService) {
  // Without `on`, advice is for today on the bank's calendar (its time zone), as everywhere.
  /** Mounted at /lots/:lotId */
  const lot = Router({ mergeParams: true });
  lot.get('/viability', requireRole('viewer'), async (req, res) => {
    const { on } = parse(onQuerySchema, req.query, 'query');
    respond(
      res,
      200,
      viabilityResponseSchema,
      await service.viability(
        bankOf(req).id,
        idParam(req.params.lotId, 'lot'),
        on ?? (await service.today(bankOf(req).id)),
      ),
    );
  });
  lot.get('/seeds-to-sow', requireRole('viewer'), async (req, res) => {
    const q = parse(seedsToSowQuerySchema, req.query, 'query');
    respond(
      res,
      200,
      seedsToSowResponseSchema,
      await service.seedsToSow(
        bankOf(req).id,
        idParam(req.params.lotId, 'lot'),
        q.plants,
        q.on ?? (await service.today(bankOf(req).id)),
        q.assurance,
      ),
    );
  });

  /** Mounted at /ranking: thousands of rows, each rendered once per change (see rankingJson). */
  const renderRankingRow = rowRenderer(rankingItemSchema);
  const ranking = Router({ mergeParams: true });
  ranking.get('/', requireRole('viewer'), async (req, res) => {
    const { on } = parse(onQuerySchema, req.query, 'query');
    const date = on ?? (await service.today(bankOf(req).id));
    respondRendered(res, 200, await service.rankingJson(bankOf(req).id, date, renderRankingRow));
  });
  return { lot, ranking };
}
