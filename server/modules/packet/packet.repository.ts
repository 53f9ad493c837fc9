import type { DbOrTx } from '#server/db/database';

/** The lot's packet page, if it is on. */
export const pageOfLot = (db: DbOrTx, bankId: string, lotId: string) =>
  db
    .selectFrom('packet_pages')
    .select(['nonce'])
    .where('bank_id', '=', bankId)
    .where('lot_id', '=', lotId)
    .executeTakeFirst();

/** Turns the lot's page on, or gives it a new nonce and token hash: the old address stops answering. */
export const savePage = (
  db: DbOrTx,
  row: { lot_id: string; bank_id: string; nonce: string; token_hash: string },
) =>
  db
    .insertInto('packet_pages')
    .values(row)
    .onConflict((oc) =>
      oc
        .column('lot_id')
        .doUpdateSet({ nonce: row.nonce, token_hash: row.token_hash, created_at: new Date() }),
    )
    .execute();

/** Turns the lot's page off. */
export const deletePage = (db: DbOrTx, bankId: string, lotId: string) =>
  db.deleteFrom('packet_pages').where('bank_id', '=', bankId).where('lot_id', '=', lotId).execute();

/** The lot a page token's hash opens. */
export const pageByHash = (db: DbOrTx, tokenHash: string) =>
  db
    .selectFrom('packet_pages')
    .select(['bank_id', 'lot_id'])
    .where('token_hash', '=', tokenHash)
    .executeTakeFirst();

/** Whether any parent plant the lot was saved from is marked a hybrid (F1). */
export async function savedFromHybrid(db: DbOrTx, bankId: string, lotId: string): Promise<boolean> {
  const row = await db
    .selectFrom('lot_parents')
    .innerJoin('parent_plants', 'parent_plants.id', 'lot_parents.parent_plant_id')
    .select('parent_plants.id')
    .where('lot_parents.lot_id', '=', lotId)
    .where('parent_plants.bank_id', '=', bankId)
    .where('parent_plants.hybrid', '=', true)
    .limit(1)
    .executeTakeFirst();
  return row !== undefined;
}

/** Whether the person is a member of the bank, any role. */
export async function isMember(db: DbOrTx, bankId: string, userId: string): Promise<boolean> {
  const row = await db
    .selectFrom('memberships')
    .select('role')
    .where('bank_id', '=', bankId)
    .where('user_id', '=', userId)
    .executeTakeFirst();
  return row !== undefined;
}
