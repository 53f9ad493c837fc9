import { sql, type Kysely } from 'kysely';

// Generations: a parent plant may have grown from one of the bank's own lots. The lot it grew from
// is in the same bank (checked by the plants service); deleting that lot only forgets the link.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable('parent_plants')
    .addColumn('grown_from_lot_id', 'uuid', (c) => c.references('lots.id').onDelete('set null'))
    .execute();
  await sql`create index parent_plants_grown_from_idx on parent_plants (grown_from_lot_id) where grown_from_lot_id is not null`.execute(
    db,
  );
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('parent_plants').dropColumn('grown_from_lot_id').execute();
}
