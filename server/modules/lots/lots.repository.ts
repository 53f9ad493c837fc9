import { CompiledQuery, sql, type Insertable, type Updateable } from 'kysely';
import type { DbOrTx } from '#server/db/database';
import type { LotSeedWeightTable, LotStatus, LotTable, StockMovementTable } from '#server/db/schema';
import { notFound } from '#server/http/errors';
import type { SeedWeightSources } from '#server/stats/index';
import type { LotAmount } from '#shared/schemas/lots';
import {
  lotSeedWeight,
  type LotSeedWeight,
  type LotSeedWeightFigures,
  type SeedWeightSample,
} from './lot-seed-weight';

const num = (v: string | null) => (v === null ? null : Number(v));

/** A timestamp as JavaScript's toISOString writes it (UTC, milliseconds), formatted by PostgreSQL. */
const isoTimestamp = (column: 'lots.created_at' | 'lots.updated_at') =>
  sql<string>`to_char(${sql.ref(column)} at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"')`;

/** What viability fits and decisions read of a lot: the ranking reads thousands, so only this. */
const DECISION_COLUMNS = [
  'lots.id',
  'lots.code',
  'lots.species_id',
  'species.common_name as species_name',
  'lots.variety',
  'lots.origin',
  'lots.source_name',
  'lots.harvest_date',
  'lots.packed_for_season',
  'lots.storage_place',
  'lots.storage_temp_c',
  'lots.treated',
  'lots.status',
  'lots.amount_kind',
  // Kept on the row by the database from the stock ledger, lot_parents and photos.
  'lots.seeds_on_hand',
  'lots.first_photo_id',
] as const;

/** The lot's weighed samples as JSON (null when it has none), oldest first. */
const seedWeightSamplesJson = sql<SeedWeightSample[] | null>`(
  select json_agg(json_build_object('seeds', w.seeds, 'grams', w.grams, 'cleanGrams', w.clean_grams)
    order by w.created_at, w.id)
  from lot_seed_weights w where w.lot_id = lots.id)`;

/** The species' typical seeds per gram, the bank's own value where it set one (even to none). */
const speciesSeedsPerGram = sql<string | null>`(
  select case when o.traits ? 'seedsPerGram' then o.traits ->> 'seedsPerGram'
    else species.traits ->> 'seedsPerGram' end
  from (select 1) one
  left join species_overrides o on o.bank_id = lots.bank_id and o.species_id = lots.species_id)`;

/** The lot with everything its page and list show, as one row. */
export function lotsQuery(db: DbOrTx, bankId: string) {
  return db
    .selectFrom('lots')
    .innerJoin('species', 'species.id', 'lots.species_id')
    .select([
      ...DECISION_COLUMNS,
      'lots.plants_bulked',
      'lots.storage_location',
      'lots.storage_humidity_pct',
      'lots.quantity_estimated',
      'lots.grams_entered',
      'lots.weighed_seeds',
      'lots.notes',
      'species.scientific_name as scientific_name',
      'lots.parent_plant_ids',
    ])
    .select([
      // As text: parsing two timestamps into Dates per row, only to print them again, cost more
      // than the rest of a row.
      isoTimestamp('lots.created_at').as('created_at'),
      isoTimestamp('lots.updated_at').as('updated_at'),
      seedWeightSamplesJson.as('seed_weight_samples'),
      speciesSeedsPerGram.as('species_seeds_per_gram'),
    ])
    .where('lots.bank_id', '=', bankId);
}

export type LotRow = Awaited<ReturnType<ReturnType<typeof lotsQuery>['executeTakeFirstOrThrow']>>;
type DecisionRow = Pick<
  LotRow,
  | 'id'
  | 'code'
  | 'species_id'
  | 'species_name'
  | 'variety'
  | 'origin'
  | 'source_name'
  | 'harvest_date'
  | 'packed_for_season'
  | 'storage_place'
  | 'storage_temp_c'
  | 'treated'
  | 'status'
  | 'amount_kind'
  | 'seeds_on_hand'
  | 'first_photo_id'
>;

const thumbUrl = (photoId: string | null) => (photoId ? `/api/photos/${photoId}?size=thumb` : null);

const toDecisionLot = (row: DecisionRow) => ({
  id: row.id,
  code: row.code,
  speciesId: row.species_id,
  speciesName: row.species_name,
  variety: row.variety,
  origin: row.origin,
  sourceName: row.source_name,
  harvestDate: row.harvest_date,
  packedForSeason: row.packed_for_season,
  storage: { place: row.storage_place, temperatureC: num(row.storage_temp_c) },
  treated: row.treated,
  status: row.status,
  amountKind: row.amount_kind,
  // The ledger's sum means nothing while the amount is not known: never read it as zero.
  seedsOnHand: row.amount_kind === 'unknown' ? null : row.seeds_on_hand,
  thumbUrl: thumbUrl(row.first_photo_id),
});

/** The lots of a bank (or of one species) as viability fits and decisions read them, by code. */
export async function lotsForDecisions(db: DbOrTx, bankId: string, speciesId?: string) {
  let q = db
    .selectFrom('lots')
    .innerJoin('species', 'species.id', 'lots.species_id')
    .select(DECISION_COLUMNS)
    .where('lots.bank_id', '=', bankId);
  if (speciesId) q = q.where('lots.species_id', '=', speciesId);
  return (await q.orderBy('lots.code').execute()).map(toDecisionLot);
}

export type DecisionLot = ReturnType<typeof toDecisionLot>;

/** What the lot's seed-weight figures are computed from, as the lot row carries them. */
function seedWeightFigures(row: Pick<LotRow, 'seed_weight_samples' | 'species_seeds_per_gram'>) {
  return lotSeedWeight(row.seed_weight_samples ?? [], num(row.species_seeds_per_gram));
}

/** The lot's amount as it is read: how it is known, and its seeds (and grams, when weighed). */
function amountOf(
  row: Pick<LotRow, 'amount_kind' | 'seeds_on_hand' | 'grams_entered'>,
  seedWeight: LotSeedWeight | null,
): LotAmount {
  switch (row.amount_kind) {
    case 'unknown':
      return { kind: 'unknown' };
    case 'weighed':
      return {
        kind: 'weighed',
        seeds: row.seeds_on_hand,
        ...(row.grams_entered !== null ? { grams: Number(row.grams_entered) } : {}),
        ...(seedWeight ? { seedWeightBasis: seedWeight.basis } : {}),
      };
    default:
      return { kind: row.amount_kind, seeds: row.seeds_on_hand };
  }
}

export function toLotDto(row: LotRow) {
  const lot = toDecisionLot(row);
  const { seedWeight } = seedWeightFigures(row);
  return {
    ...lot,
    scientificName: row.scientific_name,
    plantsBulked: row.plants_bulked,
    storage: {
      ...lot.storage,
      location: row.storage_location,
      humidityPct: num(row.storage_humidity_pct),
    },
    quantityEstimated: row.quantity_estimated,
    gramsEntered: num(row.grams_entered),
    amount: amountOf(row, seedWeight),
    seedWeight,
    notes: row.notes,
    parentPlantIds: row.parent_plant_ids,
    createdAt: row.created_at,
    updatedAt: row.updated_at,
  };
}

export interface LotPageFilters {
  limit: number;
  /** The code the previous page ended on (compared lower-cased). */
  cursor?: string | undefined;
  q?: string | undefined;
  speciesId?: string | undefined;
  status?: LotStatus | undefined;
}

// Stand-ins for a page's values while its query is compiled (see lotsPage).
const SLOT = {
  bankId: '\u0000bankId',
  status: '\u0000status',
  speciesId: '\u0000speciesId',
  like: '\u0000like',
  cursor: '\u0000cursor',
  limit: '\u0000limit',
} as const;
type Slot = keyof typeof SLOT;
const slotOf = new Map<unknown, Slot>(Object.entries(SLOT).map(([name, marker]) => [marker, name as Slot]));
const compiledPages = new Map<string, { sql: string; parameters: readonly unknown[] }>();

/**
 * One page of the bank's lots by code (lower-cased), `limit + 1` rows to tell whether more follow.
 * Its query is lotsQuery with the filters given; it is built and compiled once for each combination
 * of filters, with stand-ins for the values, and then run with each request's values: building the
 * lot query and its three subqueries cost about as much as the rest of the list's own work.
 */
export async function lotsPage(db: DbOrTx, bankId: string, filters: LotPageFilters): Promise<LotRow[]> {
  const shape = (['status', 'speciesId', 'q', 'cursor'] as const).filter((f) => filters[f]).join();
  let compiled = compiledPages.get(shape);
  if (!compiled) {
    let q = lotsQuery(db, SLOT.bankId);
    if (filters.status) q = q.where('lots.status', '=', SLOT.status as LotStatus);
    if (filters.speciesId) q = q.where('lots.species_id', '=', SLOT.speciesId);
    if (filters.q) {
      q = q.where((eb) =>
        eb.or([
          eb('lots.code', 'ilike', SLOT.like),
          eb('lots.variety', 'ilike', SLOT.like),
          eb('species.common_name', 'ilike', SLOT.like),
          eb('species.scientific_name', 'ilike', SLOT.like),
        ]),
      );
    }
    if (filters.cursor) q = q.where(sql<string>`lower(lots.code)`, '>', SLOT.cursor);
    compiled = q
      .orderBy(sql`lower(lots.code)`)
      .limit(sql<number>`${SLOT.limit}`)
      .compile();
    compiledPages.set(shape, compiled);
  }
  const values: Record<Slot, unknown> = {
    bankId,
    status: filters.status,
    speciesId: filters.speciesId,
    like: filters.q ? `%${filters.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` : undefined,
    cursor: filters.cursor?.toLowerCase(),
    limit: filters.limit + 1,
  };
  const parameters = compiled.parameters.map((p) => {
    const slot = slotOf.get(p);
    return slot ? values[slot] : p;
  });
  return (await db.executeQuery<LotRow>(CompiledQuery.raw(compiled.sql, parameters))).rows;
}

export function insertLot(db: DbOrTx, values: Insertable<LotTable>) {
  return db.insertInto('lots').values(values).returning('id').executeTakeFirstOrThrow();
}

/** Many lots in one statement (their ids given, so no order of returned rows is relied on). */
export function insertLots(db: DbOrTx, values: Insertable<LotTable>[]) {
  return db.insertInto('lots').values(values).execute();
}

export function updateLot(db: DbOrTx, lotId: string, values: Updateable<LotTable>) {
  return db.updateTable('lots').set(values).where('id', '=', lotId).execute();
}

/** Locks the lot row so concurrent stock movements are taken one at a time. */
export function lockLot(db: DbOrTx, bankId: string, lotId: string) {
  return db
    .selectFrom('lots')
    .select(['id', 'status', 'code', 'harvest_date', 'amount_kind', 'grams_entered', 'weighed_seeds'])
    .where('id', '=', lotId)
    .where('bank_id', '=', bankId)
    .forUpdate()
    .executeTakeFirst();
}

/** Every lot of the bank, ordered by code as people read it (case-insensitively). */
export function lotsByCode(db: DbOrTx, bankId: string) {
  return lotsQuery(db, bankId)
    .orderBy(sql`lower(lots.code)`)
    .execute();
}

/** The codes the bank uses. */
export async function bankCodes(db: DbOrTx, bankId: string): Promise<string[]> {
  return (await db.selectFrom('lots').select('code').where('bank_id', '=', bankId).execute()).map(
    (r) => r.code,
  );
}

export function deleteLot(db: DbOrTx, lotId: string) {
  return db.deleteFrom('lots').where('id', '=', lotId).execute();
}

/** The start date of the lot's earliest germination test, if it has one. */
export function firstAssayStart(db: DbOrTx, lotId: string) {
  return db
    .selectFrom('germination_tests')
    .select('start_date')
    .where('lot_id', '=', lotId)
    .orderBy('start_date')
    .limit(1)
    .executeTakeFirst();
}

/** Which of these parent plants are in the bank. */
export function parentPlantsOfBank(db: DbOrTx, bankId: string, ids: string[]) {
  return db
    .selectFrom('parent_plants')
    .select('id')
    .where('bank_id', '=', bankId)
    .where('id', 'in', ids)
    .execute();
}

/** Writes one line of the lot's stock ledger (other modules call this for sowings and tests). */
export function insertMovement(db: DbOrTx, values: Insertable<StockMovementTable>) {
  return db.insertInto('stock_movements').values(values).returning('id').executeTakeFirstOrThrow();
}

export function insertMovements(db: DbOrTx, values: Insertable<StockMovementTable>[]) {
  return db.insertInto('stock_movements').values(values).execute();
}

/** The ledger's sum for the lot, whatever its amount kind (see stockOf). */
export async function ledgerSum(db: DbOrTx, lotId: string): Promise<number> {
  const row = await db
    .selectFrom('stock_movements')
    .select(sql<number>`coalesce(sum(change), 0)::int`.as('total'))
    .where('lot_id', '=', lotId)
    .executeTakeFirstOrThrow();
  return row.total;
}

/**
 * Seeds on hand by the ledger, or null while the lot's amount is not known: a sowing or a test
 * from such a lot is recorded, never refused for want of stock, and never empties the lot.
 */
export async function stockOf(db: DbOrTx, lotId: string): Promise<number | null> {
  const lot = await db.selectFrom('lots').select('amount_kind').where('id', '=', lotId).executeTakeFirst();
  if (!lot || lot.amount_kind === 'unknown') return null;
  return ledgerSum(db, lotId);
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
/**
 * Takes the bank's lot-code lock until the transaction ends: whoever allocates a code for a new lot
 * holds it from reading the codes in use until the new lot is committed, so lots created at the
 * same moment never pick the same next number.
 */
export async function lockLotCodes(trx: DbOrTx, bankId: string): Promise<void> {
  await sql`select pg_advisory_xact_lock(hashtextextended(${`lot-codes:${bankId}`}, 0))`.execute(trx);
}

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

/** The common name of the lot's species. */
export async function lotSpeciesName(db: DbOrTx, lotId: string): Promise<string> {
  const row = await db
    .selectFrom('lots')
    .innerJoin('species', 'species.id', 'lots.species_id')
    .select('species.common_name')
    .where('lots.id', '=', lotId)
    .executeTakeFirstOrThrow();
  return row.common_name;
}

export function insertSeedWeightSample(db: DbOrTx, values: Insertable<LotSeedWeightTable>) {
  return db.insertInto('lot_seed_weights').values(values).returning('id').executeTakeFirstOrThrow();
}

/**
 * The lot's seed-weight figures (its samples, else its species' typical seeds per gram with the
 * bank's own value where it set one); null when the lot is not in the bank.
 */
export async function lotSeedWeightFigures(
  db: DbOrTx,
  bankId: string,
  lotId: string,
): Promise<LotSeedWeightFigures | null> {
  const row = await db
    .selectFrom('lots')
    .innerJoin('species', 'species.id', 'lots.species_id')
    .select([
      seedWeightSamplesJson.as('seed_weight_samples'),
      speciesSeedsPerGram.as('species_seeds_per_gram'),
    ])
    .where('lots.id', '=', lotId)
    .where('lots.bank_id', '=', bankId)
    .executeTakeFirst();
  return row ? seedWeightFigures(row) : null;
}

/**
 * What server/stats seedsFromGrams takes to turn a weight of this lot's seed into seeds: the lot's
 * own seeds per gram and pure-seed fraction from its weighed samples when it has any, else its
 * species' typical seeds per gram (neither: every source null, and seedsFromGrams refuses).
 * Throws a 404 AppError when the lot is not in the bank.
 */
export async function seedWeightSourcesForLot(
  db: DbOrTx,
  bankId: string,
  lotId: string,
): Promise<SeedWeightSources> {
  const figures = await lotSeedWeightFigures(db, bankId, lotId);
  if (!figures) throw notFound('No such lot in this bank.');
  return figures.sources;
}
