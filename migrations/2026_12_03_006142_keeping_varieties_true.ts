import { type Kysely, sql } from 'kysely';

// Keeping a variety true. A parent plant records how it was kept apart from other varieties of its
// species: by distance (metres), by time (flowering staggered), by bagging or caging, or not at all;
// no record is "not said". A plan entry can be a sowing for seed: a biennial's then runs over two
// seasons (overwintering, then the seed year).
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable('parent_plants')
    .addColumn('isolation_method', 'text', (c) =>
      c.check(sql`isolation_method in ('distance', 'time', 'bagging', 'none')`),
    )
    .addColumn('isolation_meters', 'numeric', (c) => c.check(sql`isolation_meters >= 0`))
    .execute();
  // Metres exactly when kept apart by distance.
  await db.schema
    .alterTable('parent_plants')
    .addCheckConstraint(
      'parent_plants_isolation_distance',
      sql`(isolation_method = 'distance') = (isolation_meters is not null) or (isolation_method is null and isolation_meters is null)`,
    )
    .execute();
  await db.schema
    .alterTable('plan_entries')
    .addColumn('for_seed', 'boolean', (c) => c.notNull().defaultTo(false))
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('plan_entries').dropColumn('for_seed').execute();
  await db.schema.alterTable('parent_plants').dropConstraint('parent_plants_isolation_distance').execute();
  await db.schema
    .alterTable('parent_plants')
    .dropColumn('isolation_meters')
    .dropColumn('isolation_method')
    .execute();
}
