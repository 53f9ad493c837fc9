import { Router } from 'express';
import { z } from 'zod';
import {
  createSpeciesBodySchema,
  overrideTraitsBodySchema,
  speciesListResponseSchema,
  speciesSchema,
} from '#shared/schemas/species';
import { requireRole } from '#server/auth/bank-access';
import { parse } from '#server/http/errors';
import { respond } from '#server/http/respond';
import { idParam } from '#server/http/params';
import type { SpeciesService } from './species.service';
import { bankOf } from '#server/http/request-context';

const one = z.object({ species: speciesSchema });

export function speciesRoutes(service: SpeciesService): Router {
  const router = Router({ mergeParams: true });
  router.get('/', requireRole('viewer'), async (req, res) => {
    respond(res, 200, speciesListResponseSchema, { items: await service.list(bankOf(req).id) });
  });
  router.post('/', requireRole('grower'), async (req, res) => {
    const body = parse(createSpeciesBodySchema, req.body, 'species');
    respond(res, 201, one, { species: await service.create(bankOf(req).id, body) });
  });
  router.patch('/:speciesId', requireRole('grower'), async (req, res) => {
    const speciesId = idParam(req.params.speciesId);
    const { traits } = parse(overrideTraitsBodySchema, req.body, 'species traits');
    respond(res, 200, one, { species: await service.setTraits(bankOf(req).id, speciesId, traits) });
  });
  router.delete('/:speciesId/overrides', requireRole('grower'), async (req, res) => {
    const speciesId = idParam(req.params.speciesId);
    respond(res, 200, one, { species: await service.clearOverrides(bankOf(req).id, speciesId) });
  });
  return router;
}
