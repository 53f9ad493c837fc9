import type { RequestHandler } from 'express';
import { AppError } from './errors';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Refuses a state-changing request whose Origin header names another site (CSRF defence on top
 * of the SameSite=Lax cookie). Requests without Origin (curl, server-to-server) pass.
 */
export function originCheck(allowedOrigins: string[]): RequestHandler {
  const allowed = new Set(allowedOrigins.map((o) => new URL(o).origin));
  return (req, _res, next) => {
    const origin = req.get('origin');
    if (SAFE_METHODS.has(req.method) || !origin || allowed.has(origin)) return next();
    next(new AppError(403, 'foreign_origin', 'This request came from another site and was refused.'));
  };
}

/** The app's own origin, and the same with localhost and 127.0.0.1 swapped (both reach it locally). */
export function originVariants(appOrigin: string): string[] {
  const url = new URL(appOrigin);
  const variants = [url.origin];
  if (url.hostname === '127.0.0.1') variants.push(url.origin.replace('127.0.0.1', 'localhost'));
  if (url.hostname === 'localhost') variants.push(url.origin.replace('localhost', '127.0.0.1'));
  return variants;
}
