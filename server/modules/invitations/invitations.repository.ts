import { sql, type Insertable } from 'kysely';
import type { DbOrTx } from '#server/db/database';
import type { InvitationTable } from '#server/db/schema';

/** The bank's invitations still open at `now`, newest first. */
export const listPending = (db: DbOrTx, bankId: string, now: Date) =>
  db
    .selectFrom('invitations')
    .leftJoin('users', 'users.id', 'invitations.invited_by')
    .select([
      'invitations.id',
      'invitations.email',
      'invitations.role',
      'invitations.created_at',
      'invitations.expires_at',
      'users.name as invitedBy',
    ])
    .where('invitations.bank_id', '=', bankId)
    .where('invitations.accepted_at', 'is', null)
    .where('invitations.revoked_at', 'is', null)
    .where('invitations.expires_at', '>', now)
    .orderBy('invitations.created_at', 'desc')
    .execute();

/** The member of the bank with this e-mail address (already lower-cased), if any. */
export const findMemberByEmail = (db: DbOrTx, bankId: string, email: string) =>
  db
    .selectFrom('memberships')
    .innerJoin('users', 'users.id', 'memberships.user_id')
    .select('users.id')
    .where('memberships.bank_id', '=', bankId)
    .where(sql<string>`lower(users.email)`, '=', email)
    .executeTakeFirst();

/** Revokes the open invitations of the bank to this address. */
export const revokeOpenTo = (db: DbOrTx, bankId: string, email: string, now: Date) =>
  db
    .updateTable('invitations')
    .set({ revoked_at: now })
    .where('bank_id', '=', bankId)
    .where('email', '=', email)
    .where('accepted_at', 'is', null)
    .where('revoked_at', 'is', null)
    .execute();

export const insertInvitation = (db: DbOrTx, values: Insertable<InvitationTable>) =>
  db
    .insertInto('invitations')
    .values(values)
    .returning(['id', 'email', 'role', 'created_at', 'expires_at'])
    .executeTakeFirstOrThrow();

export const userName = (db: DbOrTx, userId: string) =>
  db.selectFrom('users').select('name').where('id', '=', userId).executeTakeFirstOrThrow();

/** Revokes one open invitation of the bank; the result says whether one was. */
export const revokeOpen = (db: DbOrTx, bankId: string, invitationId: string, now: Date) =>
  db
    .updateTable('invitations')
    .set({ revoked_at: now })
    .where('id', '=', invitationId)
    .where('bank_id', '=', bankId)
    .where('accepted_at', 'is', null)
    .where('revoked_at', 'is', null)
    .executeTakeFirst();

/** Marks the open, unexpired invitation with this token hash accepted; undefined when there is none. */
export const acceptOpen = (db: DbOrTx, tokenHash: string, userId: string, now: Date) =>
  db
    .updateTable('invitations')
    .set({ accepted_at: now, accepted_by: userId })
    .where('token_hash', '=', tokenHash)
    .where('accepted_at', 'is', null)
    .where('revoked_at', 'is', null)
    .where('expires_at', '>', now)
    .returning(['bank_id', 'role'])
    .executeTakeFirst();

export const findMembership = (db: DbOrTx, bankId: string, userId: string) =>
  db
    .selectFrom('memberships')
    .select('role')
    .where('bank_id', '=', bankId)
    .where('user_id', '=', userId)
    .executeTakeFirst();
