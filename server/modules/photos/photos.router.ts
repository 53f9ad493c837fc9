import { Router, type Request } from 'express';
import { z } from 'zod';
import { photoSchema, photoSizeQuerySchema } from '#shared/schemas/lots';
import { requireRole } from '#server/auth/bank-access';
import { requireAuth } from '#server/auth/session.middleware';
import { parse } from '#server/http/errors';
import { idParam } from '#server/http/params';
import { respond } from '#server/http/respond';
import { singlePhoto } from '#server/photos/upload';
import type { PhotosService, SubjectRef } from './photos.service';
import { authOf, bankOf } from '#server/http/request-context';

const one = z.object({ photo: photoSchema });

/**
 * Upload and list routes for a subject, mounted under its path, e.g. /lots/:lotId/photos. A tray's
 * are mounted under its test (/tests/:testId/trays/:trayId/photos), and the tray must be that test's.
 */
export function subjectPhotoRoutes(
  photos: PhotosService,
  subject: 'lot' | 'plant' | 'tray',
  param: string,
): Router {
  const router = Router({ mergeParams: true });
  const subjectOf = (req: Request): SubjectRef => {
    const params = req.params as Record<string, unknown>;
    return {
      bankId: bankOf(req).id,
      subject,
      subjectId: idParam(params[param], subject),
      ...(subject === 'tray' ? { testId: idParam(params.testId, 'test') } : {}),
    };
  };
  router.post('/', requireRole('grower'), singlePhoto('photo'), async (req, res) => {
    const photo = await photos.upload(subjectOf(req), authOf(req).userId, req.file!.buffer);
    respond(res, 201, one, { photo });
  });
  router.get('/', requireRole('viewer'), async (req, res) => {
    const items = await photos.list(subjectOf(req));
    respond(res, 200, z.object({ items: z.array(photoSchema) }), { items });
  });
  return router;
}

/** DELETE /api/banks/:bankId/photos/:photoId */
export function bankPhotoRoutes(photos: PhotosService): Router {
  const router = Router({ mergeParams: true });
  router.delete('/:photoId', requireRole('grower'), async (req, res) => {
    await photos.remove(bankOf(req).id, idParam(req.params.photoId, 'photo'));
    res.status(204).end();
  });
  return router;
}

/** GET /api/photos/:photoId?size=full|thumb — to members of the photo's bank only. */
export function photoFileRoutes(photos: PhotosService): Router {
  const router = Router();
  router.get('/:photoId', requireAuth, async (req, res) => {
    const { size } = parse(photoSizeQuerySchema, req.query, 'query');
    const photoId = idParam(req.params.photoId, 'photo');
    const file = await photos.open(photoId, authOf(req).userId, size);
    res.setHeader('Content-Type', 'image/webp');
    // Photos never change under an id: cache for long, but only in the member's own browser.
    res.setHeader('Cache-Control', 'private, max-age=31536000, immutable');
    res.setHeader('ETag', `"${photoId}-${size}"`);
    if (file.length !== undefined) res.setHeader('Content-Length', String(file.length));
    if (req.get('if-none-match') === `"${photoId}-${size}"`) {
      file.body.destroy();
      return void res.status(304).end();
    }
    file.body.on('error', () => res.destroy());
    file.body.pipe(res);
  });
  return router;
}
