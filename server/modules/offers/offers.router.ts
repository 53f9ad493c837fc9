import { Router } from 'express';
import { z } from 'zod';
import { lotSchema } from '#shared/schemas/lots';
import {
  acceptOfferBodySchema,
  circleOffersResponseSchema,
  createOfferBodySchema,
  createOfferResponseSchema,
  declineOfferBodySchema,
  lotOffersResponseSchema,
  offerPreviewResponseSchema,
  offerRequestBodySchema,
  offerRequestResponseSchema,
  offerTokenQuerySchema,
  receivedResponseSchema,
} from '#shared/schemas/offers';
import { requireRole } from '#server/auth/bank-access';
import { requireAuth } from '#server/auth/session.middleware';
import { parse } from '#server/http/errors';
import { idParam } from '#server/http/params';
import { authOf, bankOf } from '#server/http/request-context';
import { respond } from '#server/http/respond';
import type { OffersService } from './offers.service';

const lotId = (req: { params: Record<string, unknown> }) => idParam(req.params.lotId, 'lot');
const offerId = (req: { params: Record<string, unknown> }) => idParam(req.params.offerId, 'offer');

/** /api/banks/:bankId/lots/:lotId/offers: the giver's side. */
export function lotOfferRoutes(offers: OffersService): Router {
  const router = Router({ mergeParams: true });
  router.get('/', requireRole('viewer'), async (req, res) => {
    respond(res, 200, lotOffersResponseSchema, { items: await offers.ofLot(bankOf(req).id, lotId(req)) });
  });
  router.post('/', requireRole('grower'), async (req, res) => {
    const body = parse(createOfferBodySchema, req.body, 'offer');
    const offer = await offers.create(bankOf(req).id, lotId(req), authOf(req).userId, body);
    respond(res, 201, createOfferResponseSchema, { offer });
  });
  router.delete('/:offerId', requireRole('grower'), async (req, res) => {
    await offers.withdraw(bankOf(req).id, lotId(req), offerId(req));
    res.status(204).end();
  });
  return router;
}

/** /api/banks/:bankId/lots/:lotId/received: how a lot came by an offer, with the giver's tests. */
export function receivedRoutes(offers: OffersService): Router {
  const router = Router({ mergeParams: true });
  router.get('/', requireRole('viewer'), async (req, res) => {
    respond(res, 200, receivedResponseSchema, {
      received: await offers.received(bankOf(req).id, lotId(req)),
    });
  });
  return router;
}

/** /api/offers: the receiver's side and the circle's list. */
export function offersRouter(offers: OffersService): Router {
  const router = Router();
  router.use(requireAuth);
  router.get('/', async (req, res) => {
    respond(res, 200, circleOffersResponseSchema, { items: await offers.circle(authOf(req).userId) });
  });
  router.get('/:offerId', async (req, res) => {
    const { token } = parse(offerTokenQuerySchema, req.query, 'query');
    respond(res, 200, offerPreviewResponseSchema, {
      offer: await offers.preview(offerId(req), authOf(req).userId, token),
    });
  });
  router.post('/:offerId/accept', async (req, res) => {
    const body = parse(acceptOfferBodySchema, req.body, 'acceptance');
    const lot = await offers.accept(offerId(req), authOf(req).userId, body);
    respond(res, 201, z.object({ lot: lotSchema }), { lot });
  });
  router.post('/:offerId/decline', async (req, res) => {
    const { token } = parse(declineOfferBodySchema, req.body ?? {}, 'decline');
    await offers.decline(offerId(req), authOf(req).userId, token);
    res.status(204).end();
  });
  router.post('/:offerId/requests', async (req, res) => {
    const { note } = parse(offerRequestBodySchema, req.body ?? {}, 'request');
    respond(res, 201, offerRequestResponseSchema, {
      request: await offers.ask(offerId(req), authOf(req).userId, note),
    });
  });
  return router;
}
