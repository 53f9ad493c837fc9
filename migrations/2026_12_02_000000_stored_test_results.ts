import { sql, type Kysely } from 'kysely';

// A germination test's result is computed once, by the statistics, and stored with every write that
// changes the test; every screen and the viability model read it. `result_version` says which
// definition of the result computed it: the app recomputes every test stored under an older one
// (and the tests that predate this migration, at 0), so this migration never needs app code.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable('germination_tests')
    .addColumn('result', 'jsonb')
    .addColumn('result_version', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('result_sown', 'integer')
    .addColumn('result_germinated', 'integer')
    .addColumn('result_percent', 'float8')
    .addColumn('result_mean_days', 'float8')
    .addColumn('result_last_count_date', 'date')
    .execute();
  // A tray the grower set aside (spilled, dried out) is left out of every figure, with the reason.
  await db.schema.alterTable('test_trays').addColumn('set_aside_reason', 'text').execute();
  await sql`create index germination_tests_lot_start_idx on germination_tests (lot_id, start_date)`.execute(
    db,
  );
  await sql`create index germination_tests_stale_result_idx on germination_tests (result_version)`.execute(
    db,
  );
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`drop index if exists germination_tests_stale_result_idx`.execute(db);
  await sql`drop index if exists germination_tests_lot_start_idx`.execute(db);
  await db.schema.alterTable('test_trays').dropColumn('set_aside_reason').execute();
  await db.schema
    .alterTable('germination_tests')
    .dropColumn('result')
    .dropColumn('result_version')
    .dropColumn('result_sown')
    .dropColumn('result_germinated')
    .dropColumn('result_percent')
    .dropColumn('result_mean_days')
    .dropColumn('result_last_count_date')
    .execute();
}
