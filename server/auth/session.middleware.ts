import type { Request, RequestHandler } from 'express';
import type { Clock } from '../clock';
import type { Db } from '../db/database';
import type { ReadCache } from '../db/read-cache';
import type { Role } from '../db/schema';
import { unauthorized } from '../http/errors';
import { SESSION_COOKIE, type SessionSigner } from './tokens';

/** The caller's role in the bank a /banks/:bankId/… request names (null: not a member). */
export interface PrefetchedMembership {
  bankId: string;
  role: Role | null;
}

const prefetched = new WeakMap<Request, PrefetchedMembership>();

/**
 * The membership the session middleware read together with the session, when the request names a
 * bank; bankAccess uses it instead of asking the database again for the same request.
 */
export function prefetchedMembership(req: Request, bankId: string): PrefetchedMembership | undefined {
  const found = prefetched.get(req);
  return found?.bankId === bankId.toLowerCase() ? found : undefined;
}

const BANK_PATH = /^\/banks\/([0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12})(?:\/|$)/i;

/** What the read cache keeps of a session row (scope `auth`). */
interface KeptSession {
  userId: string;
  expiresAt: number;
}

/**
 * Resolves the session cookie to req.auth; a token whose row is gone or expired is simply not
 * signed in. On a request under /banks/:bankId the caller's membership of that bank comes in the
 * same query. Both are kept in the read cache, which forgets them at once when this server signs
 * anyone out or changes a membership, and on the change notice when another server or a statement
 * does (ReadCache); with nothing kept, the row is read again.
 */
export function sessionMiddleware(
  db: Db,
  signer: SessionSigner,
  clock: Clock,
  cache: ReadCache,
): RequestHandler {
  return async (req, _res, next) => {
    const token: unknown = req.cookies?.[SESSION_COOKIE];
    if (typeof token !== 'string' || token === '') return next();
    const sessionId = await signer.verify(token);
    if (!sessionId) return next();
    const bankId = BANK_PATH.exec(req.path)?.[1]?.toLowerCase();
    const kept = cache.get<KeptSession>('auth', `session ${sessionId}`);
    if (kept && kept.expiresAt > clock.now().getTime()) {
      const role = bankId ? cache.get<Role | null>('auth', `role ${kept.userId} ${bankId}`) : null;
      if (role !== undefined) {
        req.auth = { userId: kept.userId, sessionId };
        if (bankId) prefetched.set(req, { bankId, role });
        return next();
      }
    }
    const ticket = cache.ticket();
    try {
      const session = db
        .selectFrom('sessions')
        .select(['sessions.id', 'sessions.user_id', 'sessions.expires_at'])
        .where('sessions.id', '=', sessionId)
        .where('sessions.expires_at', '>', clock.now());
      const row = bankId
        ? await session
            .leftJoin('memberships', (join) =>
              join
                .onRef('memberships.user_id', '=', 'sessions.user_id')
                .on('memberships.bank_id', '=', bankId),
            )
            .select('memberships.role')
            .executeTakeFirst()
        : await session.executeTakeFirst();
      if (row) {
        req.auth = { userId: row.user_id, sessionId: row.id };
        const expiresAt = row.expires_at.getTime();
        cache.put(
          'auth',
          `session ${row.id}`,
          { userId: row.user_id, expiresAt } satisfies KeptSession,
          ticket,
        );
        if (bankId) {
          const role = (row as { role?: Role | null }).role ?? null;
          prefetched.set(req, { bankId, role });
          cache.put('auth', `role ${row.user_id} ${bankId}`, role, ticket);
        }
      }
      next();
    } catch (error) {
      next(error);
    }
  };
}

export const requireAuth: RequestHandler = (req, _res, next) => {
  next(req.auth ? undefined : unauthorized());
};
