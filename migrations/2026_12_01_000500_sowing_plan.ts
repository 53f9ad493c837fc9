import { sql, type Kysely } from 'kysely';

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('plan_entries')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('bank_id', 'uuid', (c) => c.notNull().references('banks.id').onDelete('cascade'))
    .addColumn('season', 'integer', (c) => c.notNull().check(sql`season between 1900 and 2100`))
    .addColumn('species_id', 'uuid', (c) => c.notNull().references('species.id'))
    .addColumn('lot_id', 'uuid', (c) => c.references('lots.id').onDelete('set null'))
    // Whether the lot was chosen by the grower or suggested by Hilum.
    .addColumn('lot_chosen', 'boolean', (c) => c.notNull().defaultTo(false))
    .addColumn('plants_wanted', 'integer', (c) => c.notNull().check(sql`plants_wanted between 1 and 100000`))
    .addColumn('start', 'text', (c) => c.notNull().check(sql`start in ('indoors', 'direct')`))
    .addColumn('seeds_to_sow', 'integer')
    .addColumn('sow_from', 'date', (c) => c.notNull())
    .addColumn('sow_to', 'date', (c) => c.notNull())
    .addColumn('expect_from', 'date')
    .addColumn('expect_by', 'date')
    .addColumn('harden_from', 'date')
    .addColumn('transplant_on', 'date')
    .addColumn('notes', 'jsonb', (c) => c.notNull().defaultTo(sql`'[]'::jsonb`))
    .addColumn('sown_on', 'date')
    .addColumn('sown_movement_id', 'uuid', (c) => c.references('stock_movements.id').onDelete('set null'))
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema
    .createIndex('plan_entries_bank_season_idx')
    .on('plan_entries')
    .columns(['bank_id', 'season'])
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('plan_entries').execute();
}
