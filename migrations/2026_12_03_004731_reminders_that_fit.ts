import { sql, type Kysely } from 'kysely';

// Reminders that fit the member: a germination test's check-day mail goes to the one running it
// (`run_by`: the one who started it unless changed), each member picks the local hour their
// reminders go out (`remind_hour`, 7 unless changed), and a reminder row knows the test it is
// about, so a send can be skipped when the day was counted after it was queued (`skipped_at`).
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable('germination_tests')
    .addColumn('run_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .execute();
  await sql`update germination_tests set run_by = created_by`.execute(db);
  // Every way a test is written (the form, a CSV import, the demo) starts with its starter running it.
  await sql`
    create function germination_tests_default_run_by() returns trigger language plpgsql as $$
    begin
      new.run_by := coalesce(new.run_by, new.created_by);
      return new;
    end $$`.execute(db);
  await sql`
    create trigger germination_tests_run_by before insert on germination_tests
    for each row execute function germination_tests_default_run_by()`.execute(db);

  await db.schema
    .alterTable('memberships')
    .addColumn('remind_hour', 'smallint', (c) =>
      c
        .notNull()
        .defaultTo(7)
        .check(sql`remind_hour between 0 and 23`),
    )
    .execute();

  await db.schema
    .alterTable('reminders')
    .addColumn('test_id', 'uuid', (c) => c.references('germination_tests.id').onDelete('cascade'))
    .addColumn('skipped_at', 'timestamptz')
    .addColumn('skip_reason', 'text')
    .execute();
  await db.schema.createIndex('reminders_test_id').on('reminders').column('test_id').execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropIndex('reminders_test_id').execute();
  await db.schema
    .alterTable('reminders')
    .dropColumn('test_id')
    .dropColumn('skipped_at')
    .dropColumn('skip_reason')
    .execute();
  await db.schema.alterTable('memberships').dropColumn('remind_hour').execute();
  await sql`drop trigger germination_tests_run_by on germination_tests`.execute(db);
  await sql`drop function germination_tests_default_run_by()`.execute(db);
  await db.schema.alterTable('germination_tests').dropColumn('run_by').execute();
}
