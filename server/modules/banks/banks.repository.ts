import type { DbOrTx } from '#server/db/database';
import type { BankUpdate, Role } from '#server/db/schema';

export function insertBank(
  db: DbOrTx,
  bank: { name: string; lastFrost: string | null; firstFrost: string | null; timeZone?: string | undefined },
) {
  return db
    .insertInto('banks')
    .values({
      name: bank.name,
      last_frost: bank.lastFrost,
      first_frost: bank.firstFrost,
      ...(bank.timeZone ? { time_zone: bank.timeZone } : {}),
    })
    .returningAll()
    .executeTakeFirstOrThrow();
}

export function findBank(db: DbOrTx, bankId: string) {
  return db.selectFrom('banks').selectAll().where('id', '=', bankId).executeTakeFirst();
}

/** The bank's name, for other modules' mail and calendars. */
export function bankName(db: DbOrTx, bankId: string) {
  return db.selectFrom('banks').select('name').where('id', '=', bankId).executeTakeFirstOrThrow();
}

export function updateBank(db: DbOrTx, bankId: string, changes: BankUpdate) {
  return db
    .updateTable('banks')
    .set(changes)
    .where('id', '=', bankId)
    .returningAll()
    .executeTakeFirstOrThrow();
}

export function deleteBank(db: DbOrTx, bankId: string) {
  return db.deleteFrom('banks').where('id', '=', bankId).execute();
}

export function insertMembership(db: DbOrTx, bankId: string, userId: string, role: Role) {
  return db.insertInto('memberships').values({ bank_id: bankId, user_id: userId, role }).execute();
}

export function listMembers(db: DbOrTx, bankId: string) {
  return db
    .selectFrom('memberships')
    .innerJoin('users', 'users.id', 'memberships.user_id')
    .select(['users.id as userId', 'users.name as name', 'users.email as email', 'memberships.role as role'])
    .where('memberships.bank_id', '=', bankId)
    .orderBy('users.name')
    .execute();
}

/** The membership row, locked for the rest of the transaction, with whether its e-mail is confirmed. */
export function lockMembership(db: DbOrTx, bankId: string, userId: string) {
  return db
    .selectFrom('memberships')
    .innerJoin('users', 'users.id', 'memberships.user_id')
    .select(['memberships.role', 'users.email_verified_at'])
    .where('memberships.bank_id', '=', bankId)
    .where('memberships.user_id', '=', userId)
    .forUpdate(['memberships'])
    .executeTakeFirst();
}

/** How many owners the bank has, with every owner row locked so two demotions cannot race. */
export async function lockOwners(db: DbOrTx, bankId: string): Promise<number> {
  const rows = await db
    .selectFrom('memberships')
    .select('user_id')
    .where('bank_id', '=', bankId)
    .where('role', '=', 'owner')
    .forUpdate()
    .execute();
  return rows.length;
}

export function setRole(db: DbOrTx, bankId: string, userId: string, role: Role) {
  return db
    .updateTable('memberships')
    .set({ role })
    .where('bank_id', '=', bankId)
    .where('user_id', '=', userId)
    .execute();
}

export function deleteMembership(db: DbOrTx, bankId: string, userId: string) {
  return db.deleteFrom('memberships').where('bank_id', '=', bankId).where('user_id', '=', userId).execute();
}
