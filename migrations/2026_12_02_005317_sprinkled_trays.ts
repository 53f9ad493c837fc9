import { sql, type Kysely } from 'kysely';

// Trays sown without counting: by weight (grams of the lot's material) or by a rough guess (a
// pinch, a few dozen, hundreds). A tray keeps how it was sown and the estimate of its seeds made
// at creation (mean, SD, plausible range, and whose seeds per gram turned grams into seeds), so the
// result never changes when the lot's seed weight is refined later. `seeds_sown` is the counted
// number and is null for a tray not counted.
// A tray whose seedlings cannot be counted is scored roughly on check days (tray_scores), instead
// of counted (tray_counts).
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable('test_trays')
    .addColumn('sown_by', 'text', (c) =>
      c
        .notNull()
        .defaultTo('count')
        .check(sql`sown_by in ('count', 'weight', 'guess')`),
    )
    .addColumn('sown_grams', 'float8', (c) => c.check(sql`sown_grams > 0`))
    .addColumn('sown_guess', 'text', (c) => c.check(sql`sown_guess in ('pinch', 'few-dozen', 'hundreds')`))
    .addColumn('sown_mean', 'float8')
    .addColumn('sown_sd', 'float8', (c) => c.check(sql`sown_sd >= 0`))
    .addColumn('sown_low', 'float8')
    .addColumn('sown_high', 'float8')
    .addColumn('sown_basis', 'text', (c) => c.check(sql`sown_basis in ('lot', 'species')`))
    .addColumn('sown_purity_assumed', 'boolean', (c) => c.notNull().defaultTo(false))
    .execute();
  await sql`alter table test_trays
    alter column seeds_sown drop not null,
    add constraint test_trays_sown_kind check (
      (sown_by = 'count' and seeds_sown is not null and sown_grams is null and sown_guess is null
        and sown_mean is null)
      or (sown_by = 'weight' and seeds_sown is null and sown_grams is not null and sown_guess is null
        and sown_mean > 0 and sown_sd is not null and sown_low is not null and sown_high is not null)
      or (sown_by = 'guess' and seeds_sown is null and sown_grams is null and sown_guess is not null
        and sown_mean > 0 and sown_sd is not null and sown_low is not null and sown_high is not null)
    )`.execute(db);

  await db.schema
    .createTable('tray_scores')
    .addColumn('tray_id', 'uuid', (c) => c.notNull().references('test_trays.id').onDelete('cascade'))
    .addColumn('check_date', 'date', (c) => c.notNull())
    .addColumn('score', 'text', (c) => c.notNull().check(sql`score in ('none', 'few', 'half', 'most')`))
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addPrimaryKeyConstraint('tray_scores_pkey', ['tray_id', 'check_date'])
    .execute();

  // An estimated tray's pooled seeds sown is an expected number, not a whole one.
  await sql`alter table germination_tests alter column result_sown type float8`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`alter table germination_tests alter column result_sown type integer using round(result_sown)`.execute(
    db,
  );
  await db.schema.dropTable('tray_scores').execute();
  await sql`delete from test_trays where seeds_sown is null`.execute(db);
  await sql`alter table test_trays drop constraint test_trays_sown_kind, alter column seeds_sown set not null`.execute(
    db,
  );
  await db.schema
    .alterTable('test_trays')
    .dropColumn('sown_by')
    .dropColumn('sown_grams')
    .dropColumn('sown_guess')
    .dropColumn('sown_mean')
    .dropColumn('sown_sd')
    .dropColumn('sown_low')
    .dropColumn('sown_high')
    .dropColumn('sown_basis')
    .dropColumn('sown_purity_assumed')
    .execute();
}
