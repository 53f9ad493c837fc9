import { sql } from 'kysely';
import type { DbOrTx } from '#server/db/database';
import { MAX_LINEAGE_DEPTH } from '#shared/schemas/lots';

/**
 * The lots of a line: `lotId` and every lot of the bank its parent plants grew from, and theirs, at
 * most MAX_LINEAGE_DEPTH steps back. `union` keeps one row per lot and step, so many plants grown
 * from one lot are one step, and a cycle (refused on every write, but guarded here too) ends at the
 * depth limit instead of running on.
 */
async function lineLotIds(db: DbOrTx, bankId: string, lotId: string): Promise<string[]> {
  const { rows } = await sql<{ lot_id: string }>`
    with recursive line(lot_id, depth) as (
      select ${lotId}::uuid, 0
      union
      select pp.grown_from_lot_id, line.depth + 1
      from line
      join lot_parents lp on lp.lot_id = line.lot_id
      join parent_plants pp on pp.id = lp.parent_plant_id
      join lots grown_from on grown_from.id = pp.grown_from_lot_id
      where pp.bank_id = ${bankId} and grown_from.bank_id = ${bankId}
        and line.depth < ${MAX_LINEAGE_DEPTH}
    )
    select distinct lot_id from line`.execute(db);
  return rows.map((r) => r.lot_id);
}

/** The lots of a line with their parent plants (and the lot each grew from, in this bank). */
export async function lineRows(db: DbOrTx, bankId: string, lotId: string) {
  const ids = await lineLotIds(db, bankId, lotId);
  if (ids.length === 0) return { lots: [], parents: [] };
  const [lots, parents] = await Promise.all([
    db
      .selectFrom('lots')
      .select(['id', 'code', 'variety', 'harvest_date', 'packed_for_season', 'plants_bulked'])
      .where('bank_id', '=', bankId)
      .where('id', 'in', ids)
      .execute(),
    db
      .selectFrom('lot_parents')
      .innerJoin('parent_plants', 'parent_plants.id', 'lot_parents.parent_plant_id')
      .leftJoin('lots as grown_from', (join) =>
        join
          .onRef('grown_from.id', '=', 'parent_plants.grown_from_lot_id')
          .on('grown_from.bank_id', '=', bankId),
      )
      .select([
        'lot_parents.lot_id',
        'parent_plants.id as plant_id',
        'parent_plants.label',
        'parent_plants.hybrid',
        'grown_from.id as grown_from_lot_id',
        'grown_from.code as grown_from_code',
      ])
      .where('lot_parents.lot_id', 'in', ids)
      .where('parent_plants.bank_id', '=', bankId)
      .orderBy('parent_plants.label')
      .execute(),
  ]);
  return { lots, parents };
}

export type LineRows = Awaited<ReturnType<typeof lineRows>>;

/**
 * Whether plants grown from `fromLotId` may not be parents of `lotIds`: one of them is that lot, or
 * a lot it descends from (a lot cannot be its own ancestor).
 */
export async function makesCycle(db: DbOrTx, bankId: string, lotIds: string[], fromLotId: string) {
  if (lotIds.length === 0) return false;
  const line = new Set(await lineLotIds(db, bankId, fromLotId));
  return lotIds.some((id) => line.has(id));
}

/** The lots that name any of these plants as a parent. */
export async function lotsOfParents(db: DbOrTx, plantIds: string[]): Promise<string[]> {
  if (plantIds.length === 0) return [];
  const rows = await db
    .selectFrom('lot_parents')
    .select('lot_id')
    .distinct()
    .where('parent_plant_id', 'in', plantIds)
    .execute();
  return rows.map((r) => r.lot_id);
}

/** The lots these plants grew from (plants of this bank only). */
export async function grownFromOfPlants(db: DbOrTx, bankId: string, plantIds: string[]) {
  if (plantIds.length === 0) return [];
  return db
    .selectFrom('parent_plants')
    .select(['id', 'grown_from_lot_id'])
    .where('bank_id', '=', bankId)
    .where('id', 'in', plantIds)
    .where('grown_from_lot_id', 'is not', null)
    .execute();
}

/**
 * Serialises the bank's lineage edits (a plant's lot, a lot's parents), so two edits that each
 * pass the cycle check cannot together make a cycle.
 */
export async function lockLineage(trx: DbOrTx, bankId: string) {
  await sql`select pg_advisory_xact_lock(hashtextextended(${`lineage:${bankId}`}, 0))`.execute(trx);
}

/** A lot of the bank with its species (null: no such lot in this bank). */
export const findBankLot = (db: DbOrTx, bankId: string, lotId: string) =>
  db
    .selectFrom('lots')
    .select(['id', 'code', 'species_id', 'variety'])
    .where('bank_id', '=', bankId)
    .where('id', '=', lotId)
    .executeTakeFirst();
