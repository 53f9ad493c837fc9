import { type Kysely, sql } from 'kysely';

// How a lot's amount is known: counted, estimated ("about N"), weighed (grams turned into seeds
// through the lot's own seed weight, else its species'), or not known at all — which is not zero.
// The stock ledger stays the record of seeds in and out; while the amount is not known its sum
// says nothing of the seeds on hand. `weighed_seeds` is what the weighed grams were last turned
// into, so a new seed-weight sample corrects the ledger by the difference.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable('lots')
    .addColumn('amount_kind', 'text', (c) =>
      c
        .notNull()
        .defaultTo('counted')
        .check(sql`amount_kind in ('counted', 'estimated', 'weighed', 'unknown')`),
    )
    .addColumn('weighed_seeds', 'integer', (c) => c.check(sql`weighed_seeds >= 0`))
    .execute();
  // Lots logged before: by weight, estimated, or saved with no amount at all (no ledger line).
  await sql`
    update lots set amount_kind = case
        when quantity_estimated and grams_entered is not null then 'weighed'
        when quantity_estimated then 'estimated'
        when not exists (select 1 from stock_movements m where m.lot_id = lots.id) then 'unknown'
        else 'counted' end,
      weighed_seeds = case when quantity_estimated and grams_entered is not null
        then greatest(0, (select coalesce(sum(change), 0) from stock_movements m where m.lot_id = lots.id and m.kind = 'initial'))
        end`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('lots').dropColumn('amount_kind').dropColumn('weighed_seeds').execute();
}
