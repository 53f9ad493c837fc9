import { sql, type Kysely } from 'kysely';

// Attempt counters for the rate limits on sign-in, sign-up and password resets, kept in
// PostgreSQL so that every app server counts into the same window (server/http/rate-limit.ts).
// One row per limited key: a SHA-256 of the limit's name and what it counts (an address, an
// e-mail, an e-mail with an address), never the e-mail or address itself. A row whose window has
// ended starts again at its next attempt; ended rows are swept from time to time.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('rate_limits')
    .addColumn('key', 'text', (c) => c.primaryKey())
    .addColumn('hits', 'integer', (c) => c.notNull().check(sql`hits >= 0`))
    .addColumn('reset_at', 'timestamptz', (c) => c.notNull())
    .execute();
  await db.schema.createIndex('rate_limits_reset_at_idx').on('rate_limits').column('reset_at').execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('rate_limits').execute();
}
