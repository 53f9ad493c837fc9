import { sql, type Kysely } from 'kysely';

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('germination_tests')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('bank_id', 'uuid', (c) => c.notNull().references('banks.id').onDelete('cascade'))
    // A lot with tests is retired rather than deleted, so its history stays.
    .addColumn('lot_id', 'uuid', (c) => c.notNull().references('lots.id').onDelete('restrict'))
    .addColumn('start_date', 'date', (c) => c.notNull())
    .addColumn('method', 'text', (c) => c.notNull())
    .addColumn('medium', 'text')
    .addColumn('temperature_c', 'numeric', (c) => c.check(sql`temperature_c between -5 and 45`))
    .addColumn('light_hours', 'numeric', (c) => c.check(sql`light_hours between 0 and 24`))
    .addColumn('pretreatment', 'text', (c) =>
      c
        .notNull()
        .defaultTo('none')
        .check(sql`pretreatment in ('none', 'soak', 'cold-stratification', 'scarification')`),
    )
    .addColumn('pretreatment_days', 'integer', (c) => c.check(sql`pretreatment_days between 0 and 365`))
    .addColumn('notes', 'text')
    .addColumn('status', 'text', (c) =>
      c
        .notNull()
        .defaultTo('running')
        .check(sql`status in ('running', 'finished')`),
    )
    .addColumn('finished_on', 'date')
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('germination_tests_lot_idx').on('germination_tests').column('lot_id').execute();

  await db.schema
    .createTable('test_trays')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('test_id', 'uuid', (c) => c.notNull().references('germination_tests.id').onDelete('cascade'))
    .addColumn('position', 'integer', (c) => c.notNull().check(sql`position between 1 and 8`))
    .addColumn('seeds_sown', 'integer', (c) => c.notNull().check(sql`seeds_sown between 1 and 10000`))
    .addColumn('abnormal', 'integer', (c) => c.check(sql`abnormal >= 0`))
    .addColumn('ungerminated', 'integer', (c) => c.check(sql`ungerminated >= 0`))
    .addColumn('fresh', 'integer', (c) => c.check(sql`fresh >= 0`))
    .addColumn('dead', 'integer', (c) => c.check(sql`dead >= 0`))
    .addColumn('hard', 'integer', (c) => c.check(sql`hard >= 0`))
    .addUniqueConstraint('test_trays_position_key', ['test_id', 'position'])
    .execute();

  // Cumulative normal seedlings per tray on each check date.
  await db.schema
    .createTable('tray_counts')
    .addColumn('tray_id', 'uuid', (c) => c.notNull().references('test_trays.id').onDelete('cascade'))
    .addColumn('check_date', 'date', (c) => c.notNull())
    .addColumn('cumulative', 'integer', (c) => c.notNull().check(sql`cumulative >= 0`))
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addPrimaryKeyConstraint('tray_counts_pkey', ['tray_id', 'check_date'])
    .execute();

  // The seeds a test uses leave the lot through its ledger; the movement names its test.
  await db.schema
    .alterTable('stock_movements')
    .addColumn('test_id', 'uuid', (c) => c.references('germination_tests.id').onDelete('cascade'))
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('stock_movements').dropColumn('test_id').execute();
  await db.schema.dropTable('tray_counts').execute();
  await db.schema.dropTable('test_trays').execute();
  await db.schema.dropTable('germination_tests').execute();
}
