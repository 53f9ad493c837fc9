import { Router } from 'express';
import { z } from 'zod';
import {
  createPlantBodySchema,
  parentPlantSchema,
  plantsFromSowingBodySchema,
  updatePlantBodySchema,
} from '#shared/schemas/lots';
import { keepingTrueResponseSchema } from '#shared/schemas/seed-saving';
import { requireRole } from '#server/auth/bank-access';
import { parse } from '#server/http/errors';
import { idParam } from '#server/http/params';
import { respond } from '#server/http/respond';
import type { PlantsService } from './plants.service';
import { bankOf } from '#server/http/request-context';

const one = z.object({ plant: parentPlantSchema });

export function plantRoutes(plants: PlantsService): Router {
  const router = Router({ mergeParams: true });
  const plantId = (req: { params: Record<string, unknown> }) => idParam(req.params.plantId, 'parent plant');
  router.get('/', requireRole('viewer'), async (req, res) => {
    respond(res, 200, z.object({ items: z.array(parentPlantSchema), nextCursor: z.null() }), {
      items: await plants.list(bankOf(req).id),
      nextCursor: null,
    });
  });
  router.post('/', requireRole('grower'), async (req, res) => {
    const body = parse(createPlantBodySchema, req.body, 'parent plant');
    respond(res, 201, one, { plant: await plants.create(bankOf(req).id, body) });
  });
  // Generations: the plants kept for seed from a sown plan entry, grown from its lot.
  router.post('/from-sowing', requireRole('grower'), async (req, res) => {
    const body = parse(plantsFromSowingBodySchema, req.body, 'plants from a sowing');
    respond(res, 201, z.object({ items: z.array(parentPlantSchema) }), {
      items: await plants.createFromSowing(bankOf(req).id, body),
    });
  });
  router.get('/:plantId', requireRole('viewer'), async (req, res) => {
    respond(res, 200, one, { plant: await plants.get(bankOf(req).id, plantId(req)) });
  });
  router.patch('/:plantId', requireRole('grower'), async (req, res) => {
    const body = parse(updatePlantBodySchema, req.body, 'parent plant');
    respond(res, 200, one, { plant: await plants.update(bankOf(req).id, plantId(req), body) });
  });
  router.delete('/:plantId', requireRole('grower'), async (req, res) => {
    await plants.remove(bankOf(req).id, plantId(req));
    res.status(204).end();
  });
  return router;
}

/** Mounted at /lots/:lotId/keeping-true: the lot's population and isolation warnings. */
export function lotKeepingTrueRoutes(plants: PlantsService): Router {
  const router = Router({ mergeParams: true });
  router.get('/', requireRole('viewer'), async (req, res) => {
    respond(
      res,
      200,
      keepingTrueResponseSchema,
      await plants.keepingTrue(bankOf(req).id, idParam(req.params.lotId, 'lot')),
    );
  });
  return router;
}
