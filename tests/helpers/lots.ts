import type { Db } from '../../server/db/database';

/** The id of a reference species by its key in shared/species-reference.ts. */
export async function speciesId(db: Db, key: string): Promise<string> {
  const row = await db.selectFrom('species').select('id').where('ref_key', '=', key).executeTakeFirstOrThrow();
  return row.id;
}
