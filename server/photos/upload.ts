import type { RequestHandler } from 'express';
import multer from 'multer';
import { badRequest } from '../http/errors';
import { receiveFile } from '../http/multipart';

/** Largest photo file accepted, in bytes; a bigger one is a 413 from the error handler. */
export const MAX_PHOTO_BYTES = 15 * 1024 * 1024;

/**
 * Multipart parsing for photo uploads, held in memory (processPhoto needs the whole file anyway).
 * No filter on file name or declared type: processPhoto decides by the file's content.
 */
export const photoUpload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: MAX_PHOTO_BYTES, files: 1, fields: 20, fieldSize: 100 * 1024 },
});

/** Receives one photo in the multipart field `field`; no file (or an empty one) is a 400. */
export function singlePhoto(field = 'photo'): RequestHandler {
  const receive = receiveFile(photoUpload, field);
  return (req, res, next) => {
    receive(req, res, (error?: unknown) => {
      if (error) return next(error);
      if (!req.file || req.file.size === 0) {
        return next(badRequest('Choose a photo to upload.', { [field]: 'Choose a photo to upload.' }));
      }
      next();
    });
  };
}
