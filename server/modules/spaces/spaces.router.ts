import { Router } from 'express';
import { comingSeason } from '#shared/plan-dates';
import { seasonQuerySchema } from '#shared/schemas/plan';
import {
  createSpaceBodySchema,
  spaceEnvelopeSchema,
  spaceListResponseSchema,
  spacePlanResponseSchema,
  updateSpaceBodySchema,
} from '#shared/schemas/spaces';
import { requireRole } from '#server/auth/bank-access';
import { bankToday, type Clock } from '#server/clock';
import type { Db } from '#server/db/database';
import { parse } from '#server/http/errors';
import { idParam } from '#server/http/params';
import { bankOf } from '#server/http/request-context';
import { respond } from '#server/http/respond';
import type { SpacesService } from './spaces.service';

export function spaceRoutes(spaces: SpacesService, deps: { db: Db; clock: Clock }) {
  const spaceId = (req: { params: Record<string, unknown> }) => idParam(req.params.spaceId, 'growing space');

  /** /api/banks/:bankId/spaces */
  const router = Router({ mergeParams: true });
  router.get('/', requireRole('viewer'), async (req, res) => {
    respond(res, 200, spaceListResponseSchema, {
      items: await spaces.list(bankOf(req).id),
      nextCursor: null,
    });
  });
  router.post('/', requireRole('grower'), async (req, res) => {
    const body = parse(createSpaceBodySchema, req.body, 'growing space');
    respond(res, 201, spaceEnvelopeSchema, { space: await spaces.create(bankOf(req).id, body) });
  });
  router.patch('/:spaceId', requireRole('grower'), async (req, res) => {
    const id = spaceId(req);
    const body = parse(updateSpaceBodySchema, req.body, 'growing space');
    respond(res, 200, spaceEnvelopeSchema, { space: await spaces.update(bankOf(req).id, id, body) });
  });
  router.delete('/:spaceId', requireRole('grower'), async (req, res) => {
    await spaces.remove(bankOf(req).id, spaceId(req));
    res.status(204).end();
  });

  /** /api/banks/:bankId/plan/space */
  const plan = Router({ mergeParams: true });
  plan.get('/', requireRole('viewer'), async (req, res) => {
    const bankId = bankOf(req).id;
    const season =
      parse(seasonQuerySchema, req.query, 'query').season ??
      comingSeason(await bankToday(deps.db, deps.clock, bankId));
    respond(res, 200, spacePlanResponseSchema, await spaces.seasonSpace(bankId, season));
  });
  return { router, plan };
}
