import { Router } from 'express';
import {
  packetLotSchema,
  packetPageBodySchema,
  packetPageSchema,
  packetPageStateSchema,
} from '#shared/schemas/packet';
import { requireRole } from '#server/auth/bank-access';
import { AppError, parse } from '#server/http/errors';
import { sourceSansFile } from '#server/http/font-files';
import { idParam } from '#server/http/params';
import { respond } from '#server/http/respond';
import { authOf, bankOf } from '#server/http/request-context';
import { PACKET_FONT_PATH, packetFontFile, renderPacketGone, renderPacketPage } from './packet-html';
import type { PacketService } from './packet.service';

/**
 * The public page may show whatever a member typed (a variety), so it loads nothing but its inline
 * style and this server's own font files, runs no script, and cannot be framed.
 */
const PAGE_CSP =
  "default-src 'none'; style-src 'unsafe-inline'; font-src 'self'; base-uri 'none'; form-action 'none'; frame-ancestors 'none'";

/** /api/banks/:bankId/lots/:lotId/packet-page — whether the page is on (any role); on and off (grower). */
export function packetPageRoutes(packet: PacketService): Router {
  const router = Router({ mergeParams: true });
  const lotOf = (params: Record<string, unknown>) => idParam(params.lotId, 'lot');
  router.get('/', requireRole('viewer'), async (req, res) => {
    res.setHeader('Cache-Control', 'no-store');
    respond(res, 200, packetPageStateSchema, { url: await packet.url(bankOf(req).id, lotOf(req.params)) });
  });
  router.post('/', requireRole('grower'), async (req, res) => {
    const lotId = lotOf(req.params);
    // No settings to send: nothing, or an empty JSON object.
    if (req.body !== undefined) parse(packetPageBodySchema, req.body);
    res.setHeader('Cache-Control', 'no-store');
    respond(res, 201, packetPageSchema, { url: await packet.turnOn(bankOf(req).id, lotId) });
  });
  router.delete('/', requireRole('grower'), async (req, res) => {
    await packet.turnOff(bankOf(req).id, lotOf(req.params));
    res.status(204).end();
  });
  return router;
}

/** /api/packet-pages/:token — the lot a packet page opens, for a signed-in member of its bank. */
export function packetLookupRoutes(packet: PacketService): Router {
  const router = Router();
  router.get('/:token', async (req, res) => {
    res.setHeader('Cache-Control', 'no-store');
    respond(res, 200, packetLotSchema, await packet.lotOf(String(req.params.token), authOf(req).userId));
  });
  return router;
}

/** /p/:token — the packet page itself, for anyone holding the address: no cookie, the token is the key. */
export function publicPacketRoutes(packet: PacketService): Router {
  const router = Router();
  router.get('/:token', async (req, res) => {
    res.setHeader('Content-Security-Policy', PAGE_CSP);
    res.setHeader('X-Robots-Tag', 'noindex, nofollow');
    res.setHeader('Referrer-Policy', 'no-referrer');
    // Turning the page off must take effect at once: a cache in between asks again each time.
    res.setHeader('Cache-Control', 'private, no-cache');
    res.type('html');
    try {
      res.send(renderPacketPage(await packet.page(String(req.params.token))));
    } catch (error) {
      if (!(error instanceof AppError) || error.status !== 404) throw error;
      res.status(404).send(renderPacketGone());
    }
  });
  return router;
}

/** The packet page's font files, Source Sans 3 from this server (never a font host). */
export function packetAssetRoutes(): Router {
  const router = Router();
  const files = new Map(([400, 700] as const).map((w) => [packetFontFile(w), sourceSansFile(w)]));
  router.get('/:file', (req, res, next) => {
    const file = files.get(String(req.params.file));
    if (!file) return next();
    res.setHeader('Cache-Control', 'public, max-age=604800');
    res.type('font/woff2');
    res.sendFile(file);
  });
  return router;
}

export { PACKET_FONT_PATH };
