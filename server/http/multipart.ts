import type { RequestHandler } from 'express';
import type { Multer } from 'multer';
import { multipartError } from './errors';

/**
 * One file from the multipart field `field`, read by `upload`. Whatever goes wrong reading the
 * form (a missing boundary, a malformed part header, a form cut short) reaches the error handler
 * marked as a multipart error, which answers 400 invalid_multipart (a file over the limit: 413).
 */
export function receiveFile(upload: Multer, field: string): RequestHandler {
  const receive = upload.single(field);
  return (req, res, next) => {
    receive(req, res, (error?: unknown) => (error ? next(multipartError(error)) : next()));
  };
}
