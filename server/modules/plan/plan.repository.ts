import { sql, type Insertable, type Updateable } from 'kysely';
import type { DbOrTx } from '#server/db/database';
import type { PlanEntryTable, SowingEmergenceTable } from '#server/db/schema';

const entries = (db: DbOrTx, bankId: string) =>
  db
    .selectFrom('plan_entries')
    .innerJoin('species', 'species.id', 'plan_entries.species_id')
    .leftJoin('lots', 'lots.id', 'plan_entries.lot_id')
    .selectAll('plan_entries')
    // The lot's stock now (kept on the lot from its ledger), so the planner can say before
    // "Mark sown" that it falls short.
    .select([
      'species.common_name as species_name',
      'lots.code as lot_code',
      'lots.seeds_on_hand',
      'lots.amount_kind',
    ])
    .where('plan_entries.bank_id', '=', bankId);

export type PlanEntryRow = Awaited<ReturnType<ReturnType<typeof entries>['executeTakeFirstOrThrow']>>;

export const findEntry = (db: DbOrTx, bankId: string, entryId: string) =>
  entries(db, bankId).where('plan_entries.id', '=', entryId).executeTakeFirst();

/** The season's entries in sowing order. */
export const listSeason = (db: DbOrTx, bankId: string, season: number) =>
  entries(db, bankId)
    .where('plan_entries.season', '=', season)
    .orderBy('plan_entries.sow_from')
    .orderBy('species.common_name')
    .execute();

/** Every entry of the bank with its species and lot, for the overview. */
export const listForOverview = (db: DbOrTx, bankId: string) =>
  db
    .selectFrom('plan_entries')
    .innerJoin('species', 'species.id', 'plan_entries.species_id')
    .leftJoin('lots', 'lots.id', 'plan_entries.lot_id')
    .select([
      'plan_entries.id',
      'plan_entries.sow_from',
      'plan_entries.sow_to',
      'plan_entries.seeds_to_sow',
      'plan_entries.plants_wanted',
      'plan_entries.lot_id',
      'plan_entries.sown_on',
      'species.common_name',
      'lots.code',
    ])
    .where('plan_entries.bank_id', '=', bankId)
    .execute();

export const frostSettings = (db: DbOrTx, bankId: string) =>
  db
    .selectFrom('banks')
    .select(['last_frost', 'frost_margin_days'])
    .where('id', '=', bankId)
    .executeTakeFirstOrThrow();

/** A lot of the bank with its species, to check a chosen lot. */
export const findLotOfBank = (db: DbOrTx, bankId: string, lotId: string) =>
  db
    .selectFrom('lots')
    .select(['id', 'species_id'])
    .where('id', '=', lotId)
    .where('bank_id', '=', bankId)
    .executeTakeFirst();

export const insertEntry = (db: DbOrTx, values: Insertable<PlanEntryTable>) =>
  db.insertInto('plan_entries').values(values).returning('id').executeTakeFirstOrThrow();

export const updateEntry = (db: DbOrTx, entryId: string, changes: Updateable<PlanEntryTable>) =>
  db.updateTable('plan_entries').set(changes).where('id', '=', entryId).execute();

export const deleteEntry = (db: DbOrTx, entryId: string) =>
  db.deleteFrom('plan_entries').where('id', '=', entryId).execute();

/** Locks the entry row for a sowing mark or its undo. */
export const lockEntry = (db: DbOrTx, bankId: string, entryId: string) =>
  db
    .selectFrom('plan_entries')
    .selectAll()
    .where('id', '=', entryId)
    .where('bank_id', '=', bankId)
    .forUpdate()
    .executeTakeFirst();

export const deleteMovement = (db: DbOrTx, movementId: string) =>
  db.deleteFrom('stock_movements').where('id', '=', movementId).execute();

/** The seeds a sowing's stock movement took from its lot, and its day. */
export const sownMovement = (db: DbOrTx, movementId: string) =>
  db
    .selectFrom('stock_movements')
    .select(['id', 'change', 'date'])
    .where('id', '=', movementId)
    .executeTakeFirst();

export const insertEmergence = (db: DbOrTx, values: Insertable<SowingEmergenceTable>) =>
  db.insertInto('sowing_emergence').values(values).returning('id').executeTakeFirstOrThrow();

/**
 * Records of what came up from sowings, oldest first, each flagged `latest` when it is its
 * sowing's latest (by date, then by when it was written): the one place that rule lives.
 */
const emergenceRows = (db: DbOrTx, bankId: string) =>
  db
    .selectFrom('sowing_emergence as e')
    .innerJoin('lots as l', 'l.id', 'e.lot_id')
    .select([
      'e.id',
      'e.plan_entry_id',
      'e.lot_id',
      'l.species_id',
      'e.sown_on',
      'e.seeds_sown',
      'e.date',
      'e.seedlings',
      'e.score',
      sql<boolean>`row_number() over (partition by e.plan_entry_id order by e.date desc, e.created_at desc, e.id desc) = 1`.as(
        'latest',
      ),
    ])
    .where('e.bank_id', '=', bankId)
    .orderBy('e.date')
    .orderBy('e.created_at')
    .orderBy('e.id');

export type EmergenceRow = Awaited<ReturnType<ReturnType<typeof emergenceRows>['execute']>>[number];

/** What came up from the given plan entries' sowings. */
export const emergenceOfEntries = async (db: DbOrTx, bankId: string, entryIds: string[]) =>
  entryIds.length === 0 ? [] : emergenceRows(db, bankId).where('e.plan_entry_id', 'in', entryIds).execute();

/** What came up from every sowing of the bank's lots of the given species, for the viability fits. */
export const emergenceOfSpecies = async (db: DbOrTx, bankId: string, speciesIds: string[]) =>
  speciesIds.length === 0 ? [] : emergenceRows(db, bankId).where('l.species_id', 'in', speciesIds).execute();
