import { sql } from 'kysely';
import type { DbOrTx } from '#server/db/database';

export function findUserByEmail(db: DbOrTx, email: string) {
  return db
    .selectFrom('users')
    .selectAll()
    .where(sql<string>`lower(email)`, '=', email.toLowerCase())
    .executeTakeFirst();
}

export function findUserById(db: DbOrTx, id: string) {
  return db.selectFrom('users').select(['id', 'email', 'name']).where('id', '=', id).executeTakeFirst();
}

export function insertUser(db: DbOrTx, user: { email: string; name: string; passwordHash: string }) {
  return db
    .insertInto('users')
    .values({ email: user.email, name: user.name, password_hash: user.passwordHash })
    .returning(['id', 'email', 'name'])
    .executeTakeFirstOrThrow();
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
