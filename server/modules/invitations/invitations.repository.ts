import { sql, type Insertable } from 'kysely';
import type { DbOrTx } from '#server/db/database';
import type { InvitationTable } from '#server/db/schema';

/** The bank's invitations still open at `now`, newest first. */
export const listPending = (db: DbOrTx, bankId: string, now: Date) =>
  db
    .selectFrom('invitations')
    .leftJoin('users', 'users.id', 'invitations.invited_by')
    .leftJoin('mail_queue', 'mail_queue.id', 'invitations.mail_id')
    .select([
      'invitations.id',
      'invitations.email',
      'invitations.role',
      'invitations.created_at',
      'invitations.expires_at',
      'users.name as invitedBy',
      'mail_queue.status as mailStatus',
      'mail_queue.attempts as mailAttempts',
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

/** The open, unexpired invitation with this token hash, locked until the transaction ends. */
export const findOpenByToken = (db: DbOrTx, tokenHash: string, now: Date) =>
  db
    .selectFrom('invitations')
    .select(['id', 'bank_id', 'role', 'email'])
    .where('token_hash', '=', tokenHash)
    .where('accepted_at', 'is', null)
    .where('revoked_at', 'is', null)
    .where('expires_at', '>', now)
    .forUpdate()
    .executeTakeFirst();

export const markAccepted = (db: DbOrTx, invitationId: string, userId: string, now: Date) =>
  db
    .updateTable('invitations')
    .set({ accepted_at: now, accepted_by: userId })
    .where('id', '=', invitationId)
    .execute();

/** The bank's open, unexpired invitation with this id, locked until the transaction ends. */
export const findOpen = (db: DbOrTx, bankId: string, invitationId: string, now: Date) =>
  db
    .selectFrom('invitations')
    .select(['id', 'email', 'role', 'mail_id', 'invited_by'])
    .where('id', '=', invitationId)
    .where('bank_id', '=', bankId)
    .where('accepted_at', 'is', null)
    .where('revoked_at', 'is', null)
    .where('expires_at', '>', now)
    .forUpdate()
    .executeTakeFirst();

/** A new link (token) and expiry for an invitation being sent again. */
export const renewLink = (
  db: DbOrTx,
  invitationId: string,
  values: { token_hash: string; expires_at: Date; mail_id: string },
) =>
  db
    .updateTable('invitations')
    .set(values)
    .where('id', '=', invitationId)
    .returning(['id', 'email', 'role', 'created_at', 'expires_at'])
    .executeTakeFirstOrThrow();

export const setMail = (db: DbOrTx, invitationId: string, mailId: string) =>
  db.updateTable('invitations').set({ mail_id: mailId }).where('id', '=', invitationId).execute();

/** The account's e-mail address and whether it has proved it. */
export const accountEmail = (db: DbOrTx, userId: string) =>
  db
    .selectFrom('users')
    .select(['email', 'email_verified_at'])
    .where('id', '=', userId)
    .executeTakeFirstOrThrow();

export const findMembership = (db: DbOrTx, bankId: string, userId: string) =>
  db
    .selectFrom('memberships')
    .select('role')
    .where('bank_id', '=', bankId)
    .where('user_id', '=', userId)
    .executeTakeFirst();
