import type { DbOrTx } from '#server/db/database';

/** The member's feed of the bank, if one was made. */
export const feedOf = (db: DbOrTx, bankId: string, userId: string) =>
  db
    .selectFrom('calendar_feeds')
    .select(['nonce', 'token_hash'])
    .where('bank_id', '=', bankId)
    .where('user_id', '=', userId)
    .executeTakeFirst();

/** Makes the member's feed, or gives it a new nonce and token hash (a rotation). */
export const saveFeed = (
  db: DbOrTx,
  row: { bank_id: string; user_id: string; nonce: string; token_hash: string },
) =>
  db
    .insertInto('calendar_feeds')
    .values(row)
    .onConflict((oc) =>
      oc.columns(['bank_id', 'user_id']).doUpdateSet({ nonce: row.nonce, token_hash: row.token_hash }),
    )
    .execute();

/** Makes the member's feed unless it has one (two first calls at once keep the first). */
export const insertFeedIfNone = (
  db: DbOrTx,
  row: { bank_id: string; user_id: string; nonce: string; token_hash: string },
) =>
  db
    .insertInto('calendar_feeds')
    .values(row)
    .onConflict((oc) => oc.columns(['bank_id', 'user_id']).doNothing())
    .execute();

/** The bank a feed token's hash belongs to, while its member is still a member (the row cascades away otherwise). */
export const feedByHash = (db: DbOrTx, tokenHash: string) =>
  db
    .selectFrom('calendar_feeds')
    .innerJoin('memberships', (j) =>
      j
        .onRef('memberships.bank_id', '=', 'calendar_feeds.bank_id')
        .onRef('memberships.user_id', '=', 'calendar_feeds.user_id'),
    )
    .select(['calendar_feeds.bank_id', 'calendar_feeds.user_id'])
    .where('calendar_feeds.token_hash', '=', tokenHash)
    .executeTakeFirst();
