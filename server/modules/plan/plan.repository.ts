import { sql, type Insertable, type Updateable } from 'kysely';
import type { DbOrTx } from '#server/db/database';
import type { PlanEntryTable, PlanMoveTable, SowingEmergenceTable } from '#server/db/schema';

const entries = (db: DbOrTx, bankId: string) =>
  db
    .selectFrom('plan_entries')
    .innerJoin('species', 'species.id', 'plan_entries.species_id')
    .leftJoin('lots', 'lots.id', 'plan_entries.lot_id')
    .selectAll('plan_entries')
    // The lot's stock now (kept on the lot from its ledger), so the planner can say before
    // "Mark sown" that it falls short.
    .select((eb) => [
      'species.common_name as species_name',
      'lots.code as lot_code',
      'lots.seeds_on_hand',
      'lots.amount_kind',
      // How many sowings its succession has now (a sowing taken out no longer counts).
      eb
        .selectFrom('plan_entries as sibling')
        .select(eb.fn.countAll<string>().as('n'))
        .whereRef('sibling.succession_id', '=', 'plan_entries.succession_id')
        .as('succession_of'),
    ])
    .where('plan_entries.bank_id', '=', bankId);

export type PlanEntryRow = Awaited<ReturnType<ReturnType<typeof entries>['executeTakeFirstOrThrow']>>;

export const findEntry = (db: DbOrTx, bankId: string, entryId: string) =>
  entries(db, bankId).where('plan_entries.id', '=', entryId).executeTakeFirst();

export const findEntries = (db: DbOrTx, bankId: string, entryIds: string[]) =>
  entryIds.length === 0
    ? Promise.resolve([])
    : entries(db, bankId).where('plan_entries.id', 'in', entryIds).execute();

/** The season's entries (in no set order: their live dates order them). */
export const listSeason = (db: DbOrTx, bankId: string, season: number) =>
  entries(db, bankId).where('plan_entries.season', '=', season).execute();

/** Every entry of the bank, or only those not yet sown, with species and lot. */
export const listAll = (db: DbOrTx, bankId: string, only?: 'unsown') => {
  const q = entries(db, bankId);
  return (only === 'unsown' ? q.where('plan_entries.sown_on', 'is', null) : q).execute();
};

/** How many unsown entries each season from `season` on has. */
export const unsownBySeason = (db: DbOrTx, bankId: string, fromSeason: number) =>
  db
    .selectFrom('plan_entries')
    .select(['season', (eb) => eb.fn.countAll<string>().as('n')])
    .where('bank_id', '=', bankId)
    .where('sown_on', 'is', null)
    .where('season', '>=', fromSeason)
    .groupBy('season')
    .orderBy('season')
    .execute();

export const insertMove = (db: DbOrTx, values: Insertable<PlanMoveTable>) =>
  db.insertInto('plan_moves').values(values).returningAll().executeTakeFirstOrThrow();

/** The latest frost-date move of a season's plan. */
export const latestMove = (db: DbOrTx, bankId: string, season: number) =>
  db
    .selectFrom('plan_moves')
    .selectAll()
    .where('bank_id', '=', bankId)
    .where('season', '=', season)
    .orderBy('created_at', 'desc')
    .limit(1)
    .executeTakeFirst();

export const frostSettings = (db: DbOrTx, bankId: string) =>
  db
    .selectFrom('banks')
    .select(['last_frost', 'first_frost', 'frost_margin_days'])
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
