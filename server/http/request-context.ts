import type { Request } from 'express';

/**
 * The signed-in caller, for a route mounted behind requireAuth (or bankAccess, which needs it).
 * A route that asks for it without that guard is a programming error, said as such.
 */
export function authOf(req: Request): NonNullable<Request['auth']> {
  if (!req.auth)
    throw new Error(`${req.method} ${req.originalUrl}: authOf() on a route that is not behind requireAuth`);
  return req.auth;
}

/** The bank a /api/banks/:bankId/… route serves and the caller's role in it (set by bankAccess). */
export function bankOf(req: Request): NonNullable<Request['bank']> {
  if (!req.bank)
    throw new Error(`${req.method} ${req.originalUrl}: bankOf() on a route that is not behind bankAccess`);
  return req.bank;
}
