import type { RequestHandler } from 'express';
import type { Db } from '../db/database';
import type { Role } from '../db/schema';
import { forbidden, notFound, unauthorized } from '../http/errors';
import { idSchema } from '../../shared/schemas/common';

const RANK: Record<Role, number> = { viewer: 1, grower: 2, owner: 3 };

export const roleAtLeast = (role: Role, least: Role) => RANK[role] >= RANK[least];

/**
 * Resolves :bankId and the caller's role for every /api/banks/:bankId/… route. A bank the caller
 * is not a member of is 404, exactly like a bank that does not exist.
 */
export function bankAccess(db: Db): RequestHandler {
  return async (req, _res, next) => {
    if (!req.auth) return next(unauthorized());
    const parsed = idSchema.safeParse(req.params.bankId);
    if (!parsed.success) return next(notFound('No such bank.'));
    const bankId = parsed.data;
    try {
      const row = await db
        .selectFrom('memberships')
        .select('role')
        .where('bank_id', '=', bankId)
        .where('user_id', '=', req.auth.userId)
        .executeTakeFirst();
      if (!row) return next(notFound('No such bank.'));
      req.bank = { id: bankId, role: row.role };
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
