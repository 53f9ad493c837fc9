import { sql, type Kysely } from 'kysely';

// A bank's indoor growing spaces (server/modules/spaces): a shelf or box under lights and how many
// trays or cells fit in it. Names are unique in a bank, whatever their case.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('growing_spaces')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('bank_id', 'uuid', (c) => c.notNull().references('banks.id').onDelete('cascade'))
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('capacity', 'integer', (c) => c.notNull().check(sql`capacity between 1 and 100000`))
    .addColumn('unit', 'text', (c) => c.notNull().check(sql`unit in ('cells', 'trays')`))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await sql`create unique index growing_spaces_bank_name_idx on growing_spaces (bank_id, lower(name))`.execute(
    db,
  );
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('growing_spaces').execute();
}
