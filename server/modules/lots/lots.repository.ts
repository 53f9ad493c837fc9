import { sql, type ExpressionBuilder, type Insertable, type Updateable } from 'kysely';
import type { DbOrTx } from '../../db/database';
import type { Database, LotTable } from '../../db/schema';

const num = (v: string | null) => (v === null ? null : Number(v));

/** The lot with everything its page and list show, as one row. */
export function lotsQuery(db: DbOrTx, bankId: string) {
  return db
    .selectFrom('lots')
    .innerJoin('species', 'species.id', 'lots.species_id')
    .selectAll('lots')
    .select(['species.common_name as species_name', 'species.scientific_name as scientific_name'])
    .select((eb: ExpressionBuilder<Database, 'lots' | 'species'>) => [
      eb
        .selectFrom('stock_movements')
        .select(sql<number>`coalesce(sum(change), 0)::int`.as('s'))
        .whereRef('stock_movements.lot_id', '=', 'lots.id')
        .as('seeds_on_hand'),
      eb
        .selectFrom('lot_parents')
        .select(sql<string[]>`coalesce(array_agg(parent_plant_id::text order by parent_plant_id), '{}')`.as('p'))
        .whereRef('lot_parents.lot_id', '=', 'lots.id')
        .as('parent_plant_ids'),
      eb
        .selectFrom('photos')
        .select('photos.id')
        .whereRef('photos.subject_id', '=', 'lots.id')
        .where('photos.subject', '=', 'lot')
        .orderBy('photos.created_at')
        .limit(1)
        .as('first_photo_id'),
    ])
    .where('lots.bank_id', '=', bankId);
}

export type LotRow = Awaited<ReturnType<ReturnType<typeof lotsQuery>['executeTakeFirstOrThrow']>>;

export function toLotDto(row: LotRow) {
  return {
    id: row.id,
    code: row.code,
    speciesId: row.species_id,
    speciesName: row.species_name,
    scientificName: row.scientific_name,
    variety: row.variety,
    origin: row.origin,
    sourceName: row.source_name,
    harvestDate: row.harvest_date,
    packedForSeason: row.packed_for_season,
    plantsBulked: row.plants_bulked,
    storage: {
      place: row.storage_place,
      location: row.storage_location,
      temperatureC: num(row.storage_temp_c),
      humidityPct: num(row.storage_humidity_pct),
    },
    quantityEstimated: row.quantity_estimated,
    treated: row.treated,
    gramsEntered: num(row.grams_entered),
    status: row.status,
    notes: row.notes,
    seedsOnHand: row.seeds_on_hand ?? 0,
    parentPlantIds: row.parent_plant_ids ?? [],
    thumbUrl: row.first_photo_id ? `/api/photos/${row.first_photo_id}?size=thumb` : null,
    createdAt: row.created_at.toISOString(),
    updatedAt: row.updated_at.toISOString(),
  };
}

export function insertLot(db: DbOrTx, values: Insertable<LotTable>) {
  return db.insertInto('lots').values(values).returning('id').executeTakeFirstOrThrow();
}

export function updateLot(db: DbOrTx, lotId: string, values: Updateable<LotTable>) {
  return db.updateTable('lots').set(values).where('id', '=', lotId).execute();
}

/** Locks the lot row so concurrent stock movements are taken one at a time. */
export function lockLot(db: DbOrTx, bankId: string, lotId: string) {
  return db
    .selectFrom('lots')
    .select(['id', 'status', 'code', 'harvest_date'])
    .where('id', '=', lotId)
    .where('bank_id', '=', bankId)
    .forUpdate()
    .executeTakeFirst();
}

export async function stockOf(db: DbOrTx, lotId: string): Promise<number> {
  const row = await db
    .selectFrom('stock_movements')
    .select(sql<number>`coalesce(sum(change), 0)::int`.as('total'))
    .where('lot_id', '=', lotId)
    .executeTakeFirstOrThrow();
  return row.total;
}

/** Replaces the lot's parent plants (call inside the lot's transaction). */
export async function setParents(db: DbOrTx, lotId: string, parentIds: string[]) {
  await db.deleteFrom('lot_parents').where('lot_id', '=', lotId).execute();
  if (parentIds.length === 0) return;
  await db
    .insertInto('lot_parents')
    .values([...new Set(parentIds)].map((id) => ({ lot_id: lotId, parent_plant_id: id })))
    .execute();
}

/** The codes in the bank that start with `prefix`, to number the next one. */
export async function codesLike(db: DbOrTx, bankId: string, prefix: string): Promise<string[]> {
  const rows = await db
    .selectFrom('lots')
    .select('code')
    .where('bank_id', '=', bankId)
    .where(sql<string>`upper(code)`, 'like', `${prefix.toUpperCase()}%`)
    .execute();
  return rows.map((r) => r.code);
}

export function movementsOf(db: DbOrTx, lotId: string) {
  return db
    .selectFrom('stock_movements')
    .leftJoin('users', 'users.id', 'stock_movements.created_by')
    .select([
      'stock_movements.id',
      'stock_movements.kind',
      'stock_movements.change',
      'stock_movements.date',
      'stock_movements.reason',
      'stock_movements.created_at',
      'users.name as by',
    ])
    .where('stock_movements.lot_id', '=', lotId)
    .orderBy('stock_movements.date')
    .orderBy('stock_movements.created_at')
    .execute();
}
