import { sql } from 'kysely';
import type { DbOrTx } from '#server/db/database';

export function findUserByEmail(db: DbOrTx, email: string) {
  return db
    .selectFrom('users')
    .selectAll()
    .where(sql<string>`lower(email)`, '=', email.toLowerCase())
    .executeTakeFirst();
}

/** The account as the API shows it. */
export function publicUser(row: { id: string; email: string; name: string; email_verified_at: Date | null }) {
  return { id: row.id, email: row.email, name: row.name, emailVerified: row.email_verified_at != null };
}

export function findUserById(db: DbOrTx, id: string) {
  return db
    .selectFrom('users')
    .select(['id', 'email', 'name', 'email_verified_at'])
    .where('id', '=', id)
    .executeTakeFirst();
}

export function insertUser(db: DbOrTx, user: { email: string; name: string; passwordHash: string }) {
  return db
    .insertInto('users')
    .values({ email: user.email, name: user.name, password_hash: user.passwordHash })
    .returning(['id', 'email', 'name', 'email_verified_at'])
    .executeTakeFirstOrThrow();
}

/** Records that the account proved its address, if that is still the account's address. */
export function markEmailVerified(db: DbOrTx, userId: string, email: string, now: Date) {
  return db
    .updateTable('users')
    .set({ email_verified_at: now })
    .where('id', '=', userId)
    .where(sql<string>`lower(email)`, '=', email.toLowerCase())
    .where('email_verified_at', 'is', null)
    .execute();
}

export function insertEmailVerification(
  db: DbOrTx,
  link: { userId: string; email: string; tokenHash: string; expiresAt: Date; now: Date },
) {
  return db
    .insertInto('email_verifications')
    .values({
      user_id: link.userId,
      email: link.email,
      token_hash: link.tokenHash,
      expires_at: link.expiresAt,
      created_at: link.now,
    })
    .execute();
}

/** Marks a valid verification link used; returns its account and address, or undefined. */
export function consumeEmailVerification(db: DbOrTx, tokenHash: string, now: Date) {
  return db
    .updateTable('email_verifications')
    .set({ used_at: now })
    .where('token_hash', '=', tokenHash)
    .where('used_at', 'is', null)
    .where('expires_at', '>', now)
    .returning(['user_id', 'email'])
    .executeTakeFirst();
}

export function setPassword(db: DbOrTx, userId: string, passwordHash: string, now: Date) {
  return db
    .updateTable('users')
    .set({ password_hash: passwordHash, updated_at: now })
    .where('id', '=', userId)
    .execute();
}

export function insertSession(
  db: DbOrTx,
  session: { userId: string; expiresAt: Date; userAgent: string | null; now: Date },
) {
  return db
    .insertInto('sessions')
    .values({
      user_id: session.userId,
      expires_at: session.expiresAt,
      user_agent: session.userAgent,
      created_at: session.now,
      last_seen_at: session.now,
    })
    .returning('id')
    .executeTakeFirstOrThrow();
}

export function deleteSession(db: DbOrTx, sessionId: string) {
  return db.deleteFrom('sessions').where('id', '=', sessionId).execute();
}

export function deleteUserSessions(db: DbOrTx, userId: string) {
  return db.deleteFrom('sessions').where('user_id', '=', userId).execute();
}

export function membershipsOf(db: DbOrTx, userId: string) {
  return db
    .selectFrom('memberships')
    .innerJoin('banks', 'banks.id', 'memberships.bank_id')
    .select(['banks.id as bankId', 'banks.name as bankName', 'memberships.role as role'])
    .where('memberships.user_id', '=', userId)
    .orderBy('banks.name')
    .execute();
}

export function insertPasswordReset(
  db: DbOrTx,
  reset: { userId: string; tokenHash: string; expiresAt: Date; now: Date },
) {
  return db
    .insertInto('password_resets')
    .values({
      user_id: reset.userId,
      token_hash: reset.tokenHash,
      expires_at: reset.expiresAt,
      created_at: reset.now,
    })
    .execute();
}

/** The user of a reset token that is unused and unexpired, read without using it up. */
export function findOpenPasswordReset(db: DbOrTx, tokenHash: string, now: Date) {
  return db
    .selectFrom('password_resets')
    .select('user_id')
    .where('token_hash', '=', tokenHash)
    .where('used_at', 'is', null)
    .where('expires_at', '>', now)
    .executeTakeFirst();
}

/** Ends every unused reset link of the user (after one of them set a new password). */
export function closePasswordResets(db: DbOrTx, userId: string, now: Date) {
  return db
    .updateTable('password_resets')
    .set({ used_at: now })
    .where('user_id', '=', userId)
    .where('used_at', 'is', null)
    .execute();
}

/** Marks a valid reset token used and returns its user, or undefined when it is used or expired. */
export function consumePasswordReset(db: DbOrTx, tokenHash: string, now: Date) {
  return db
    .updateTable('password_resets')
    .set({ used_at: now })
    .where('token_hash', '=', tokenHash)
    .where('used_at', 'is', null)
    .where('expires_at', '>', now)
    .returning('user_id')
    .executeTakeFirst();
}
