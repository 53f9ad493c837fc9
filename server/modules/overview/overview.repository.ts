import { sql } from 'kysely';
import type { DbOrTx } from '#server/db/database';

/** The bank's running tests with their last count, the result so far and the trays still counted. */
export const runningAssaysWithTrays = (db: DbOrTx, bankId: string) =>
  db
    .selectFrom('germination_tests')
    .innerJoin('lots', 'lots.id', 'germination_tests.lot_id')
    .select([
      'germination_tests.id',
      'germination_tests.start_date',
      'lots.id as lot_id',
      'lots.code',
      'lots.species_id',
      'germination_tests.result_last_count_date as last_count',
    ])
    .select(sql<number | null>`(germination_tests.result->>'percentRounded')::int`.as('percent_so_far'))
    .select(
      sql<boolean>`coalesce((germination_tests.result->>'seedsSownEstimated')::boolean, false)`.as(
        'percent_estimated',
      ),
    )
    // Trays still to count: a set-aside tray is not counted any more.
    .select((eb) =>
      eb
        .selectFrom('test_trays')
        .select(eb.fn.countAll<number>().as('n'))
        .whereRef('test_trays.test_id', '=', 'germination_tests.id')
        .where('test_trays.set_aside_reason', 'is', null)
        .as('trays'),
    )
    .where('germination_tests.bank_id', '=', bankId)
    .where('germination_tests.status', '=', 'running')
    .execute();
