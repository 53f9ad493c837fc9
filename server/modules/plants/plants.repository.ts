import type { Insertable, Updateable } from 'kysely';
import type { DbOrTx } from '#server/db/database';
import type { ParentPlantTable } from '#server/db/schema';

const plantsOf = (db: DbOrTx, bankId: string) =>
  db
    .selectFrom('parent_plants')
    // Generations: the lot the plant grew from, and its code.
    .leftJoin('lots as grown_from', 'grown_from.id', 'parent_plants.grown_from_lot_id')
    .select([
      'parent_plants.id',
      'parent_plants.species_id',
      'parent_plants.label',
      'parent_plants.variety',
      'parent_plants.location',
      'parent_plants.season',
      'parent_plants.hybrid',
      'parent_plants.notes',
      'parent_plants.grown_from_lot_id',
      'grown_from.code as grown_from_code',
      // Keeping a variety true.
      'parent_plants.isolation_method',
      'parent_plants.isolation_meters',
    ])
    .where('parent_plants.bank_id', '=', bankId);

export type PlantRow = Awaited<ReturnType<typeof listPlants>>[number];

export const findPlant = (db: DbOrTx, bankId: string, plantId: string) =>
  plantsOf(db, bankId).where('parent_plants.id', '=', plantId).executeTakeFirst();

/** The bank's parent plants, newest season first. */
export const listPlants = (db: DbOrTx, bankId: string) =>
  plantsOf(db, bankId).orderBy('parent_plants.season', 'desc').orderBy('parent_plants.label').execute();

export const insertPlant = (db: DbOrTx, values: Insertable<ParentPlantTable>) =>
  db.insertInto('parent_plants').values(values).returning('id').executeTakeFirstOrThrow();

export const updatePlant = (db: DbOrTx, plantId: string, changes: Updateable<ParentPlantTable>) =>
  db.updateTable('parent_plants').set(changes).where('id', '=', plantId).execute();

export const deletePlant = (db: DbOrTx, plantId: string) =>
  db.deleteFrom('parent_plants').where('id', '=', plantId).execute();

/** Generations: the plants kept for seed from one sowing, in one statement. */
export const insertPlants = (db: DbOrTx, values: Insertable<ParentPlantTable>[]) =>
  db.insertInto('parent_plants').values(values).returning('id').execute();

// ---- Keeping a variety true -------------------------------------------------------------------

/** Each lot a parent plant is a parent of, with the plants its seed was saved from (bulked, else its parents). */
export const lotPopulationsOfPlants = (db: DbOrTx, bankId: string) =>
  db
    .selectFrom('lot_parents')
    .innerJoin('lots', 'lots.id', 'lot_parents.lot_id')
    .select((eb) => [
      'lot_parents.parent_plant_id',
      eb.fn
        .coalesce('lots.plants_bulked', eb.fn<number>('cardinality', ['lots.parent_plant_ids']))
        .as('plants'),
    ])
    .where('lots.bank_id', '=', bankId)
    .execute();

/** A lot of the bank with what its keeping-true warnings read. */
export const lotForKeepingTrue = (db: DbOrTx, bankId: string, lotId: string) =>
  db
    .selectFrom('lots')
    .select(['id', 'species_id', 'plants_bulked', 'parent_plant_ids'])
    .where('bank_id', '=', bankId)
    .where('id', '=', lotId)
    .executeTakeFirst();
