import type { Insertable, Updateable } from 'kysely';
import type { DbOrTx } from '#server/db/database';
import type { ParentPlantTable } from '#server/db/schema';

const plantsOf = (db: DbOrTx, bankId: string) =>
  db
    .selectFrom('parent_plants')
    .select(['id', 'species_id', 'label', 'variety', 'location', 'season', 'hybrid', 'notes'])
    .where('bank_id', '=', bankId);

export type PlantRow = Awaited<ReturnType<typeof listPlants>>[number];

export const findPlant = (db: DbOrTx, bankId: string, plantId: string) =>
  plantsOf(db, bankId).where('id', '=', plantId).executeTakeFirst();

/** The bank's parent plants, newest season first. */
export const listPlants = (db: DbOrTx, bankId: string) =>
  plantsOf(db, bankId).orderBy('season', 'desc').orderBy('label').execute();

export const insertPlant = (db: DbOrTx, values: Insertable<ParentPlantTable>) =>
  db.insertInto('parent_plants').values(values).returning('id').executeTakeFirstOrThrow();

export const updatePlant = (db: DbOrTx, plantId: string, changes: Updateable<ParentPlantTable>) =>
  db.updateTable('parent_plants').set(changes).where('id', '=', plantId).execute();

export const deletePlant = (db: DbOrTx, plantId: string) =>
  db.deleteFrom('parent_plants').where('id', '=', plantId).execute();
