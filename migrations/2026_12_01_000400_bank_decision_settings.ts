import { sql, type Kysely } from 'kysely';

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable('banks')
    // Sow when the projected lower bound reaches this, where the species has no published standard.
    .addColumn('sow_threshold_percent', 'integer', (c) =>
      c
        .notNull()
        .defaultTo(70)
        .check(sql`sow_threshold_percent between 1 and 100`),
    )
    // Share of germinated seeds that become plants worth planting out (common practice: about 0.9).
    .addColumn('establishment_factor', 'numeric', (c) =>
      c
        .notNull()
        .defaultTo(0.9)
        .check(sql`establishment_factor > 0 and establishment_factor <= 1`),
    )
    .addColumn('sowing_assurance', 'numeric', (c) =>
      c
        .notNull()
        .defaultTo(0.9)
        .check(sql`sowing_assurance > 0 and sowing_assurance < 1`),
    )
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable('banks')
    .dropColumn('sow_threshold_percent')
    .dropColumn('establishment_factor')
    .dropColumn('sowing_assurance')
    .execute();
}
