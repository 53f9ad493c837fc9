import type { Kysely } from 'kysely';

export async function up(db: Kysely<any>): Promise<void> {
  // Seed sold coated with fungicide or another treatment: the product shows a handling caution.
  await db.schema
    .alterTable('lots')
    .addColumn('treated', 'boolean', (c) => c.notNull().defaultTo(false))
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('lots').dropColumn('treated').execute();
}
