import type { Kysely } from 'kysely';

// A whole test can be set aside with a reason (mouldy towel, too cold, mixed-up seed): it stays
// in the lot's history but leaves the viability model, visibly.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('germination_tests').addColumn('set_aside_reason', 'text').execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('germination_tests').dropColumn('set_aside_reason').execute();
}
