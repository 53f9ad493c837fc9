import { sql, type Kysely } from 'kysely';

// Replays of a write made harmless (server/http/idempotency.ts). A phone that saved counts offline
// sends each queued write with an Idempotency-Key of its own making; the first request with a key
// claims a row (status null while it runs), and its answer is kept there, so the same write sent
// again — the connection dropped before the answer came back, two tabs sending one queue — gets the
// first answer instead of being applied twice. Keys are per member: one member's key never meets
// another's. `request_hash` is a SHA-256 (hex) of the method, path and body, so a key reused for a
// different write is refused. Rows older than a week are swept as new ones come.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('idempotency_keys')
    .addColumn('user_id', 'uuid', (c) => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('key', 'text', (c) => c.notNull())
    .addColumn('request_hash', 'text', (c) => c.notNull())
    .addColumn('status', 'integer', (c) => c.check(sql`status between 200 and 499`))
    .addColumn('body', 'jsonb')
    .addColumn('created_at', 'timestamptz', (c) => c.notNull())
    .addPrimaryKeyConstraint('idempotency_keys_pkey', ['user_id', 'key'])
    .execute();
  await db.schema
    .createIndex('idempotency_keys_created_at_idx')
    .on('idempotency_keys')
    .column('created_at')
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('idempotency_keys').execute();
}
