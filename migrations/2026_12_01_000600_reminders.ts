import { sql, type Kysely } from 'kysely';

export async function up(db: Kysely<any>): Promise<void> {
  // Each member's reminder choices; null means the role's default (on for owner and grower).
  await db.schema
    .alterTable('memberships')
    .addColumn('remind_sowing', 'boolean')
    .addColumn('remind_checks', 'boolean')
    .addColumn('remind_retest', 'boolean')
    .addColumn('remind_digest', 'boolean')
    .execute();

  // One row per reminder that is due, unique by what it is about, so it is sent at most once.
  await db.schema
    .createTable('reminders')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('dedupe_key', 'text', (c) => c.notNull().unique())
    .addColumn('bank_id', 'uuid', (c) => c.notNull().references('banks.id').onDelete('cascade'))
    .addColumn('user_id', 'uuid', (c) => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('kind', 'text', (c) => c.notNull().check(sql`kind in ('sowing', 'check', 'retest', 'digest')`))
    .addColumn('due_on', 'date', (c) => c.notNull())
    .addColumn('subject', 'text', (c) => c.notNull())
    .addColumn('body', 'text', (c) => c.notNull())
    .addColumn('attempts', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('sending_since', 'timestamptz')
    .addColumn('sent_at', 'timestamptz')
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('reminders').execute();
  await db.schema
    .alterTable('memberships')
    .dropColumn('remind_sowing')
    .dropColumn('remind_checks')
    .dropColumn('remind_retest')
    .dropColumn('remind_digest')
    .execute();
  await sql`drop schema if exists pgboss cascade`.execute(db);
}
