import { sql, type Kysely } from 'kysely';

// Offers of part of a lot from one bank to another (server/modules/offers): addressed to a bank
// (`to_bank_id`) or open to whoever holds the link (`token_hash`, the SHA-256 of the link's token;
// the token itself is never stored). Accepting makes a lot in the receiving bank (`accepted_lot_id`)
// and copies the giver's finished tests into `received_tests`, read-only evidence of that lot.
// Members of the giving bank may ask for an offered lot (`offer_requests`), which mails the giver.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('lot_offers')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('from_bank_id', 'uuid', (c) => c.notNull().references('banks.id').onDelete('cascade'))
    .addColumn('lot_id', 'uuid', (c) => c.notNull().references('lots.id').onDelete('cascade'))
    .addColumn('seeds', 'integer', (c) => c.notNull().check(sql`seeds > 0`))
    .addColumn('to_bank_id', 'uuid', (c) => c.references('banks.id').onDelete('cascade'))
    .addColumn('token_hash', 'text', (c) => c.unique())
    .addColumn('expires_at', 'timestamptz')
    .addColumn('show_bank_name', 'boolean', (c) => c.notNull().defaultTo(true))
    .addColumn('status', 'text', (c) =>
      c
        .notNull()
        .defaultTo('open')
        .check(sql`status in ('open', 'accepted', 'declined', 'withdrawn')`),
    )
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('decided_at', 'timestamptz')
    .addColumn('accepted_bank_id', 'uuid', (c) => c.references('banks.id').onDelete('set null'))
    .addColumn('accepted_lot_id', 'uuid', (c) => c.references('lots.id').onDelete('set null'))
    .addColumn('accepted_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    // Exactly one way to reach the receiver: a bank, or a link.
    .addCheckConstraint('lot_offers_one_way', sql`(to_bank_id is null) <> (token_hash is null)`)
    .execute();
  await db.schema.createIndex('lot_offers_lot_idx').on('lot_offers').column('lot_id').execute();
  await db.schema.createIndex('lot_offers_to_bank_idx').on('lot_offers').column('to_bank_id').execute();
  await db.schema
    .createIndex('lot_offers_accepted_lot_idx')
    .on('lot_offers')
    .column('accepted_lot_id')
    .execute();

  await db.schema
    .createTable('offer_requests')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('offer_id', 'uuid', (c) => c.notNull().references('lot_offers.id').onDelete('cascade'))
    .addColumn('user_id', 'uuid', (c) => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('note', 'text')
    .addColumn('mail_id', 'uuid')
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint('offer_requests_once', ['offer_id', 'user_id'])
    .execute();

  await db.schema
    .createTable('received_tests')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('bank_id', 'uuid', (c) => c.notNull().references('banks.id').onDelete('cascade'))
    .addColumn('lot_id', 'uuid', (c) => c.notNull().references('lots.id').onDelete('cascade'))
    .addColumn('offer_id', 'uuid', (c) => c.references('lot_offers.id').onDelete('set null'))
    .addColumn('start_date', 'date', (c) => c.notNull())
    .addColumn('finished_on', 'date')
    .addColumn('method', 'text', (c) => c.notNull())
    .addColumn('medium', 'text')
    .addColumn('temperature_c', 'numeric')
    .addColumn('light_hours', 'numeric')
    .addColumn('pretreatment', 'text', (c) => c.notNull())
    .addColumn('trays', 'integer', (c) => c.notNull())
    .addColumn('result', 'jsonb', (c) => c.notNull())
    .addColumn('result_sown', 'integer')
    .addColumn('result_germinated', 'integer')
    .addColumn('result_percent', 'float8')
    .addColumn('result_mean_days', 'float8')
    .addColumn('result_last_count_date', 'date')
    .execute();
  await db.schema.createIndex('received_tests_lot_idx').on('received_tests').column('lot_id').execute();
  // The giver's tests are the received lot's evidence: they move its species' viability stamp.
  await sql`
    create trigger received_tests_viability_stamp after insert or update or delete on received_tests
    for each row execute function viability_stamp_tests()`.execute(db);

  await sql`alter table mail_queue drop constraint mail_queue_kind_check`.execute(db);
  await sql`alter table mail_queue add constraint mail_queue_kind_check
    check (kind in ('invitation', 'password_reset', 'email_verification', 'offer_request'))`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`delete from mail_queue where kind = 'offer_request'`.execute(db);
  await sql`alter table mail_queue drop constraint mail_queue_kind_check`.execute(db);
  await sql`alter table mail_queue add constraint mail_queue_kind_check
    check (kind in ('invitation', 'password_reset', 'email_verification'))`.execute(db);
  await db.schema.dropTable('received_tests').execute();
  await db.schema.dropTable('offer_requests').execute();
  await db.schema.dropTable('lot_offers').execute();
}
