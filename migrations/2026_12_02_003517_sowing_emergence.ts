import { type Kysely, sql } from 'kysely';

// What came up from a sowing: a plan entry marked sown can record, on a later day, the seedlings
// that emerged from it — counted, or scored roughly (none / a few / about half / most). A grower may
// look again a week later: every record is kept (the history), and the latest of a sowing (by date,
// then by when it was written) is what came up, the one the viability model reads.
//
// The record is of one sowing, so it goes with that sowing's stock movement: undoing the sowing
// deletes the movement and, through the foreign key, what was recorded as coming up from it.
// Writes move the lot's species viability stamp (the fits read them) and send the bank's change
// notice (read caches), through the functions the earlier migrations made for tests and lots.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('sowing_emergence')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('bank_id', 'uuid', (c) => c.notNull().references('banks.id').onDelete('cascade'))
    .addColumn('plan_entry_id', 'uuid', (c) => c.notNull().references('plan_entries.id').onDelete('cascade'))
    .addColumn('lot_id', 'uuid', (c) => c.notNull().references('lots.id').onDelete('cascade'))
    .addColumn('sown_movement_id', 'uuid', (c) =>
      c.notNull().references('stock_movements.id').onDelete('cascade'),
    )
    // The sowing as its movement took it from the lot: the day and the seeds.
    .addColumn('sown_on', 'date', (c) => c.notNull())
    .addColumn('seeds_sown', 'integer', (c) => c.notNull().check(sql`seeds_sown > 0`))
    .addColumn('date', 'date', (c) => c.notNull())
    .addColumn('seedlings', 'integer', (c) => c.check(sql`seedlings >= 0 and seedlings <= seeds_sown`))
    .addColumn('score', 'text', (c) => c.check(sql`score in ('none', 'few', 'half', 'most')`))
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`clock_timestamp()`))
    .addCheckConstraint('sowing_emergence_one_reading', sql`(seedlings is null) <> (score is null)`)
    .addCheckConstraint('sowing_emergence_after_sowing', sql`date >= sown_on`)
    .execute();
  await db.schema
    .createIndex('sowing_emergence_entry_idx')
    .on('sowing_emergence')
    .columns(['plan_entry_id', 'date'])
    .execute();
  await db.schema
    .createIndex('sowing_emergence_bank_lot_idx')
    .on('sowing_emergence')
    .columns(['bank_id', 'lot_id'])
    .execute();
  await db.schema
    .createIndex('sowing_emergence_movement_idx')
    .on('sowing_emergence')
    .column('sown_movement_id')
    .execute();
  // viability_stamp_tests() bumps the stamp of the species of the row's lot_id, old and new.
  await sql`
    create trigger sowing_emergence_viability_stamp after insert or update or delete on sowing_emergence
    for each row execute function viability_stamp_tests()`.execute(db);
  await sql`
    create trigger sowing_emergence_change_notice after insert or update or delete on sowing_emergence
    for each row execute function change_notice_bank('bank_id')`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`drop trigger sowing_emergence_change_notice on sowing_emergence`.execute(db);
  await sql`drop trigger sowing_emergence_viability_stamp on sowing_emergence`.execute(db);
  await db.schema.dropTable('sowing_emergence').execute();
}
