import { sql } from 'kysely';
import type { DbOrTx } from '../../db/database';

/** The cheapest round trip to the database. */
export const selectOne = (db: DbOrTx) => sql`select 1`.execute(db);
