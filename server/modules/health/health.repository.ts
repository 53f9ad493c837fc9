import { sql } from 'kysely';
import type { DbOrTx } from '#server/db/database';

/** The cheapest round trip to the database. */
export const selectOne = (db: DbOrTx) => sql`select 1`.execute(db);
