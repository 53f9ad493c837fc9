import { type Kysely, sql } from 'kysely';

// A lot's weighed samples: the grower counts seeds and weighs them (the seed-testing rules'
// thousand-seed weight, by replicates), and optionally weighs them again once the chaff and other
// matter are picked out (the pure-seed fraction of a purity analysis). The lot's own seeds per gram
// and cleanliness are computed from every sample (server/stats/seed-weight.ts), never stored.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('lot_seed_weights')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('bank_id', 'uuid', (c) => c.notNull().references('banks.id').onDelete('cascade'))
    .addColumn('lot_id', 'uuid', (c) => c.notNull().references('lots.id').onDelete('cascade'))
    .addColumn('seeds', 'integer', (c) => c.notNull().check(sql`seeds > 0`))
    .addColumn('grams', 'numeric', (c) => c.notNull().check(sql`grams > 0`))
    .addColumn('clean_grams', 'numeric')
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addCheckConstraint(
      'lot_seed_weights_clean',
      sql`clean_grams is null or (clean_grams > 0 and clean_grams <= grams)`,
    )
    .execute();
  await db.schema.createIndex('lot_seed_weights_lot_idx').on('lot_seed_weights').column('lot_id').execute();
  // Lot pages kept in memory show the lot's seed weight: a sample is a change of its bank.
  await sql`
    create trigger lot_seed_weights_change_notice after insert or update or delete on lot_seed_weights
    for each row execute function change_notice_bank('bank_id')`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('lot_seed_weights').execute();
}
