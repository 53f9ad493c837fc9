import { sql, type Kysely } from 'kysely';

// Every e-mail the app sends (invitations, password resets, address checks) is a row here first,
// written in the transaction of what it announces, and sent from here by a worker with retries
// (server/mail/mail-queue.ts). Invitations point at their latest mail, so the owner sees its state.
// Accounts confirm their e-mail address by a link; until then `email_verified_at` is null.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('mail_queue')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('kind', 'text', (c) =>
      c.notNull().check(sql`kind in ('invitation', 'password_reset', 'email_verification')`),
    )
    .addColumn('to_address', 'text', (c) => c.notNull())
    // Null until written: a reset request's text is written by the worker, who looks up the account.
    .addColumn('subject', 'text')
    // Holds a link token until the mail is sent, then is cleared.
    .addColumn('body', 'text')
    .addColumn('status', 'text', (c) =>
      c
        .notNull()
        .defaultTo('waiting')
        .check(sql`status in ('waiting', 'sending', 'sent', 'skipped', 'expired')`),
    )
    .addColumn('attempts', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('next_attempt_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('claimed_at', 'timestamptz')
    .addColumn('sent_at', 'timestamptz')
    .addColumn('last_error', 'text')
    .addColumn('expires_at', 'timestamptz')
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await sql`create index mail_queue_due_idx on mail_queue (next_attempt_at) where status in ('waiting', 'sending')`.execute(
    db,
  );

  await db.schema
    .alterTable('invitations')
    .addColumn('mail_id', 'uuid', (c) => c.references('mail_queue.id').onDelete('set null'))
    .execute();

  await db.schema.alterTable('users').addColumn('email_verified_at', 'timestamptz').execute();
  await db.schema
    .createTable('email_verifications')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('user_id', 'uuid', (c) => c.notNull().references('users.id').onDelete('cascade'))
    // The address the link was sent to: a link proves that address only.
    .addColumn('email', 'text', (c) => c.notNull())
    .addColumn('token_hash', 'text', (c) => c.notNull().unique())
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('expires_at', 'timestamptz', (c) => c.notNull())
    .addColumn('used_at', 'timestamptz')
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('email_verifications').execute();
  await db.schema.alterTable('users').dropColumn('email_verified_at').execute();
  await db.schema.alterTable('invitations').dropColumn('mail_id').execute();
  await db.schema.dropTable('mail_queue').execute();
}
