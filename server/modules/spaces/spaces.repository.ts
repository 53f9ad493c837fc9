import type { Insertable, Updateable } from 'kysely';
import type { DbOrTx } from '#server/db/database';
import type { GrowingSpaceTable } from '#server/db/schema';

const spacesOf = (db: DbOrTx, bankId: string) =>
  db.selectFrom('growing_spaces').select(['id', 'name', 'capacity', 'unit']).where('bank_id', '=', bankId);

export type SpaceRow = Awaited<ReturnType<typeof listSpaces>>[number];

/** The bank's spaces in the order they were added. */
export const listSpaces = (db: DbOrTx, bankId: string) =>
  spacesOf(db, bankId).orderBy('created_at').orderBy('id').execute();

export const findSpace = (db: DbOrTx, bankId: string, spaceId: string) =>
  spacesOf(db, bankId).where('id', '=', spaceId).executeTakeFirst();

export const insertSpace = (db: DbOrTx, values: Insertable<GrowingSpaceTable>) =>
  db.insertInto('growing_spaces').values(values).returning('id').executeTakeFirstOrThrow();

export const updateSpace = (
  db: DbOrTx,
  bankId: string,
  spaceId: string,
  changes: Updateable<GrowingSpaceTable>,
) =>
  db
    .updateTable('growing_spaces')
    .set(changes)
    .where('bank_id', '=', bankId)
    .where('id', '=', spaceId)
    .execute();

export const deleteSpace = (db: DbOrTx, bankId: string, spaceId: string) =>
  db.deleteFrom('growing_spaces').where('bank_id', '=', bankId).where('id', '=', spaceId).executeTakeFirst();
