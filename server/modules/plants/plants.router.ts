import { Router } from 'express';
import { z } from 'zod';
import { createPlantBodySchema, parentPlantSchema, updatePlantBodySchema } from '../../../shared/schemas/lots';
import { requireRole } from '../../auth/bank-access';
import { parse } from '../../http/errors';
import { idParam } from '../../http/params';
import { respond } from '../../http/respond';
import type { PlantsService } from './plants.service';

const one = z.object({ plant: parentPlantSchema });

export function plantRoutes(plants: PlantsService): Router {
  const router = Router({ mergeParams: true });
  const plantId = (req: { params: Record<string, unknown> }) => idParam(req.params.plantId, 'parent plant');
  router.get('/', requireRole('viewer'), async (req, res) => {
    respond(res, 200, z.object({ items: z.array(parentPlantSchema), nextCursor: z.null() }), {
      items: await plants.list(req.bank!.id),
      nextCursor: null,
    });
  });
  router.post('/', requireRole('grower'), async (req, res) => {
    const body = parse(createPlantBodySchema, req.body, 'parent plant');
    respond(res, 201, one, { plant: await plants.create(req.bank!.id, body) });
  });
  router.get('/:plantId', requireRole('viewer'), async (req, res) => {
    respond(res, 200, one, { plant: await plants.get(req.bank!.id, plantId(req)) });
  });
  router.patch('/:plantId', requireRole('grower'), async (req, res) => {
    const body = parse(updatePlantBodySchema, req.body, 'parent plant');
    respond(res, 200, one, { plant: await plants.update(req.bank!.id, plantId(req), body) });
  });
  router.delete('/:plantId', requireRole('grower'), async (req, res) => {
    await plants.remove(req.bank!.id, plantId(req));
    res.status(204).end();
  });
  return router;
}
