import type { RequestHandler } from 'express';
import type { Clock } from '../clock';
import type { Db } from '../db/database';
import { unauthorized } from '../http/errors';
import { SESSION_COOKIE, type SessionSigner } from './tokens';

/** Resolves the session cookie to req.auth; a token whose row is gone is simply not signed in. */
export function sessionMiddleware(db: Db, signer: SessionSigner, clock: Clock): RequestHandler {
  return async (req, _res, next) => {
    const token: unknown = req.cookies?.[SESSION_COOKIE];
    if (typeof token !== 'string' || token === '') return next();
    const sessionId = await signer.verify(token);
    if (!sessionId) return next();
    try {
      const row = await db
        .selectFrom('sessions')
        .select(['id', 'user_id'])
        .where('id', '=', sessionId)
        .where('expires_at', '>', clock.now())
        .executeTakeFirst();
      if (row) req.auth = { userId: row.user_id, sessionId: row.id };
      next();
    } catch (error) {
      next(error);
    }
  };
}

export const requireAuth: RequestHandler = (req, _res, next) => {
  next(req.auth ? undefined : unauthorized());
};
