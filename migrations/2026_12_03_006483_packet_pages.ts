import { sql, type Kysely } from 'kysely';

// A lot's public packet page (server/modules/packet), at most one per lot, turned on and off by a
// grower. Its address holds a token; as for calendar feeds, only the token's SHA-256 is kept to look
// it up, and the token is an HMAC of `nonce` under the server's secret, so the address (and the
// label's QR code) can be made again without storing it. Turning the page on again draws a new
// nonce; turning it off deletes the row. Deleting the lot deletes its page.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('packet_pages')
    .addColumn('lot_id', 'uuid', (c) => c.primaryKey().references('lots.id').onDelete('cascade'))
    .addColumn('bank_id', 'uuid', (c) => c.notNull().references('banks.id').onDelete('cascade'))
    .addColumn('nonce', 'text', (c) => c.notNull())
    .addColumn('token_hash', 'text', (c) => c.notNull().unique())
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('packet_pages').execute();
}
