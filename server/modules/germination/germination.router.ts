import { Router } from 'express';
import { z } from 'zod';
import {
  assayDetailQuerySchema,
  countsBodySchema,
  createAssayBodySchema,
  finishBodySchema,
  assayDetailSchema,
  assaySetAsideBodySchema,
  trayUpdateBodySchema,
  updateAssayBodySchema,
} from '#shared/schemas/germination';
import { isoDateSchema } from '#shared/schemas/common';
import { requireRole } from '#server/auth/bank-access';
import { notFound, parse } from '#server/http/errors';
import { idParam } from '#server/http/params';
import { respond } from '#server/http/respond';
import type { GerminationService } from './germination.service';
import { authOf, bankOf } from '#server/http/request-context';

/** /api/banks/:bankId/lots/:lotId/tests */
export function lotAssayRoutes(assays: GerminationService): Router {
  const router = Router({ mergeParams: true });
  const lotId = (req: { params: Record<string, unknown> }) => idParam(req.params.lotId, 'lot');
  router.post('/', requireRole('grower'), async (req, res) => {
    const body = parse(createAssayBodySchema, req.body, 'germination test');
    respond(
      res,
      201,
      assayDetailSchema,
      await assays.create(bankOf(req).id, lotId(req), authOf(req).userId, body),
    );
  });
  router.get('/', requireRole('viewer'), async (req, res) => {
    respond(res, 200, z.object({ items: z.array(assayDetailSchema), nextCursor: z.null() }), {
      items: await assays.listForLot(bankOf(req).id, lotId(req)),
      nextCursor: null,
    });
  });
  return router;
}

/** /api/banks/:bankId/tests/:testId… */
export function assayRoutes(assays: GerminationService): Router {
  const router = Router({ mergeParams: true });
  const assayId = (req: { params: Record<string, unknown> }) => idParam(req.params.testId, 'test');
  router.get('/:testId', requireRole('viewer'), async (req, res) => {
    const { interval } = parse(assayDetailQuerySchema, req.query, 'query');
    respond(res, 200, assayDetailSchema, await assays.detail(bankOf(req).id, assayId(req), interval));
  });
  router.patch('/:testId', requireRole('grower'), async (req, res) => {
    const body = parse(updateAssayBodySchema, req.body, 'germination test');
    respond(res, 200, assayDetailSchema, await assays.update(bankOf(req).id, assayId(req), body));
  });
  router.delete('/:testId', requireRole('grower'), async (req, res) => {
    await assays.remove(bankOf(req).id, assayId(req));
    res.status(204).end();
  });
  router.post('/:testId/counts', requireRole('grower'), async (req, res) => {
    const body = parse(countsBodySchema, req.body, 'counts');
    respond(
      res,
      201,
      assayDetailSchema,
      await assays.recordCounts(bankOf(req).id, assayId(req), authOf(req).userId, body),
    );
  });
  router.delete('/:testId/counts/:date', requireRole('grower'), async (req, res) => {
    const date = isoDateSchema.safeParse(req.params.date);
    if (!date.success) throw notFound('No counts on that date.');
    respond(res, 200, assayDetailSchema, await assays.deleteCounts(bankOf(req).id, assayId(req), date.data));
  });
  router.post('/:testId/finish', requireRole('grower'), async (req, res) => {
    const body = parse(finishBodySchema, req.body, 'finish');
    respond(res, 200, assayDetailSchema, await assays.finish(bankOf(req).id, assayId(req), body));
  });
  router.patch('/:testId/trays/:trayId', requireRole('grower'), async (req, res) => {
    const body = parse(trayUpdateBodySchema, req.body, 'tray');
    const trayId = idParam(req.params.trayId, 'tray');
    respond(
      res,
      200,
      assayDetailSchema,
      await assays.setTrayAside(bankOf(req).id, assayId(req), trayId, body.setAsideReason),
    );
  });
  router.post('/:testId/set-aside', requireRole('grower'), async (req, res) => {
    const body = parse(assaySetAsideBodySchema, req.body, 'set aside');
    respond(
      res,
      200,
      assayDetailSchema,
      await assays.setAssayAside(bankOf(req).id, assayId(req), body.reason),
    );
  });
  router.post('/:testId/reopen', requireRole('grower'), async (req, res) => {
    respond(res, 200, assayDetailSchema, await assays.reopen(bankOf(req).id, assayId(req)));
  });
  return router;
}
