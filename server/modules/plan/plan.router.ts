import { Router } from 'express';
import { z } from 'zod';
import { comingSeason } from '#shared/plan-dates';
import {
  createPlanBodySchema,
  createPlanResponseSchema,
  emergenceBodySchema,
  emergenceResponseSchema,
  planEntrySchema,
  planListResponseSchema,
  seasonQuerySchema,
  sownBodySchema,
  updatePlanBodySchema,
} from '#shared/schemas/plan';
import { requireRole } from '#server/auth/bank-access';
import { bankToday, type Clock } from '#server/clock';
import type { Db } from '#server/db/database';
import { parse } from '#server/http/errors';
import { idParam } from '#server/http/params';
import { respond } from '#server/http/respond';
import type { ViabilityService } from '../viability/viability.service';
import type { PlanService } from './plan.service';
import { authOf, bankOf } from '#server/http/request-context';

const one = z.object({ entry: planEntrySchema });

export function planRoutes(plan: PlanService, deps: { db: Db; clock: Clock; viability: ViabilityService }) {
  const thisSeason = async (bankId: string) => comingSeason(await bankToday(deps.db, deps.clock, bankId));
  const entryId = (req: { params: Record<string, unknown> }) => idParam(req.params.entryId, 'plan entry');

  /** /api/banks/:bankId/plan */
  const router = Router({ mergeParams: true });
  router.get('/', requireRole('viewer'), async (req, res) => {
    const season = parse(seasonQuerySchema, req.query, 'query').season ?? (await thisSeason(bankOf(req).id));
    respond(res, 200, planListResponseSchema, {
      season,
      items: await plan.list(bankOf(req).id, season),
      nextCursor: null,
      moved: await plan.latestMove(bankOf(req).id, season),
    });
  });
  router.post('/', requireRole('grower'), async (req, res) => {
    const body = parse(createPlanBodySchema, req.body, 'plan entry');
    respond(res, 201, createPlanResponseSchema, await plan.create(bankOf(req).id, authOf(req).userId, body));
  });
  router.get('/:entryId', requireRole('viewer'), async (req, res) => {
    respond(res, 200, one, { entry: await plan.get(bankOf(req).id, entryId(req)) });
  });
  router.patch('/:entryId', requireRole('grower'), async (req, res) => {
    const body = parse(updatePlanBodySchema, req.body, 'plan entry');
    respond(res, 200, one, { entry: await plan.update(bankOf(req).id, entryId(req), body) });
  });
  router.delete('/:entryId', requireRole('grower'), async (req, res) => {
    await plan.remove(bankOf(req).id, entryId(req));
    res.status(204).end();
  });
  router.post('/:entryId/sown', requireRole('grower'), async (req, res) => {
    const body = parse(sownBodySchema, req.body ?? {}, 'sowing');
    respond(res, 200, one, {
      entry: await plan.markSown(bankOf(req).id, entryId(req), authOf(req).userId, body),
    });
  });
  router.post('/:entryId/emergence', requireRole('grower'), async (req, res) => {
    const body = parse(emergenceBodySchema, req.body, 'what came up');
    respond(
      res,
      201,
      emergenceResponseSchema,
      await plan.recordEmergence(bankOf(req).id, entryId(req), authOf(req).userId, body),
    );
  });
  router.delete('/:entryId/sown', requireRole('grower'), async (req, res) => {
    respond(res, 200, one, { entry: await plan.undoSown(bankOf(req).id, entryId(req)) });
  });

  /** /api/banks/:bankId/plan.ics */
  const ics = Router({ mergeParams: true });
  ics.get('/', requireRole('viewer'), async (req, res) => {
    const season = parse(seasonQuerySchema, req.query, 'query').season ?? (await thisSeason(bankOf(req).id));
    const calendar = await plan.calendar(bankOf(req).id, season);
    res.setHeader('Content-Type', 'text/calendar; charset=utf-8');
    res.setHeader('Content-Disposition', `attachment; filename="hilum-plan-${season}.ics"`);
    res.send(calendar);
  });
  return { router, ics };
}
