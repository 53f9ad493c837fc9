import { type Kysely, sql } from 'kysely';

// A plan that follows its inputs. An unsown entry's dates are worked out on every read from the
// bank's frost dates and the species; the stored dates are what was planned last (and, once sown,
// the dates it was sown under, kept). Succession sowings are entries of one succession, each a
// number of days after the first. A moved frost date leaves a record of what it moved, for the
// planner to say so.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable('plan_entries')
    .addColumn('succession_id', 'uuid')
    .addColumn('succession_no', 'integer', (c) => c.check(sql`succession_no >= 1`))
    .addColumn('succession_weeks', 'integer', (c) => c.check(sql`succession_weeks >= 1`))
    .addColumn('offset_days', 'integer', (c) =>
      c
        .notNull()
        .defaultTo(0)
        .check(sql`offset_days >= 0`),
    )
    .execute();
  await db.schema
    .createIndex('plan_entries_succession_idx')
    .on('plan_entries')
    .column('succession_id')
    .where(sql.ref('succession_id'), 'is not', null)
    .execute();
  await db.schema
    .createTable('plan_moves')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('bank_id', 'uuid', (c) => c.notNull().references('banks.id').onDelete('cascade'))
    .addColumn('season', 'integer', (c) => c.notNull())
    // The bank's last frost before and after, as MM-DD.
    .addColumn('from_frost', 'text', (c) => c.notNull())
    .addColumn('to_frost', 'text', (c) => c.notNull())
    .addColumn('days', 'integer', (c) => c.notNull())
    .addColumn('entries', 'integer', (c) => c.notNull().check(sql`entries >= 0`))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`clock_timestamp()`))
    .execute();
  await db.schema
    .createIndex('plan_moves_bank_season_idx')
    .on('plan_moves')
    .columns(['bank_id', 'season', 'created_at'])
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('plan_moves').execute();
  await db.schema.dropIndex('plan_entries_succession_idx').execute();
  await db.schema
    .alterTable('plan_entries')
    .dropColumn('succession_id')
    .dropColumn('succession_no')
    .dropColumn('succession_weeks')
    .dropColumn('offset_days')
    .execute();
}
