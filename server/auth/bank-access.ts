import type { RequestHandler } from 'express';
import type { Db } from '../db/database';
import type { Role } from '../db/schema';
import { forbidden, notFound, unauthorized } from '../http/errors';
import { idSchema } from '#shared/schemas/common';
import { prefetchedMembership } from './session.middleware';

const RANK: Record<Role, number> = { viewer: 1, grower: 2, owner: 3 };

export const roleAtLeast = (role: Role, least: Role) => RANK[role] >= RANK[least];

/**
 * Resolves :bankId and the caller's role for every /api/banks/:bankId/… route, on every request.
 * A bank the caller is not a member of is 404, exactly like a bank that does not exist. The role
 * usually came with the session row, in the same query (sessionMiddleware); otherwise it is read here.
 */
export function bankAccess(db: Db): RequestHandler {
  return async (req, _res, next) => {
    if (!req.auth) return next(unauthorized());
    const parsed = idSchema.safeParse(req.params.bankId);
    if (!parsed.success) return next(notFound('No such bank.'));
    const bankId = parsed.data;
    try {
      const known = prefetchedMembership(req, bankId);
      const role = known
        ? known.role
        : ((
            await db
              .selectFrom('memberships')
              .select('role')
              .where('bank_id', '=', bankId)
              .where('user_id', '=', req.auth.userId)
              .executeTakeFirst()
          )?.role ?? null);
      if (!role) return next(notFound('No such bank.'));
      req.bank = { id: bankId, role };
      next();
    } catch (error) {
      next(error);
    }
  };
}

/** The least role a route needs: viewer reads, grower writes records, owner manages the bank. */
export function requireRole(least: Role): RequestHandler {
  return (req, _res, next) => {
    if (!req.bank) return next(notFound('No such bank.'));
    next(roleAtLeast(req.bank.role, least) ? undefined : forbidden());
  };
}
