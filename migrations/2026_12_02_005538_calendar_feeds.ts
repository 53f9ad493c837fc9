import { sql, type Kysely } from 'kysely';

// Each member's private calendar feed of a bank (server/modules/calendar). The feed's address
// holds a token; only its SHA-256 is kept here to look it up. The token is an HMAC, under the
// server's secret, of `nonce`, so the member can be shown the same address again without it being
// stored; a rotation draws a new nonce. Removing the member removes the feed.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('calendar_feeds')
    .addColumn('bank_id', 'uuid', (c) => c.notNull())
    .addColumn('user_id', 'uuid', (c) => c.notNull())
    .addColumn('nonce', 'text', (c) => c.notNull())
    .addColumn('token_hash', 'text', (c) => c.notNull().unique())
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addPrimaryKeyConstraint('calendar_feeds_pkey', ['bank_id', 'user_id'])
    .addForeignKeyConstraint(
      'calendar_feeds_membership_fkey',
      ['bank_id', 'user_id'],
      'memberships',
      ['bank_id', 'user_id'],
      (c) => c.onDelete('cascade'),
    )
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('calendar_feeds').execute();
}
