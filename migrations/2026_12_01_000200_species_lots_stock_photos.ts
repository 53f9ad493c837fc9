import { sql, type Kysely } from 'kysely';

export async function up(db: Kysely<any>): Promise<void> {
  // Reference species have bank_id null and a ref_key; a bank's own species have its bank_id.
  await db.schema
    .createTable('species')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('bank_id', 'uuid', (c) => c.references('banks.id').onDelete('cascade'))
    .addColumn('ref_key', 'text', (c) => c.unique())
    .addColumn('common_name', 'text', (c) => c.notNull())
    .addColumn('scientific_name', 'text', (c) => c.notNull())
    .addColumn('family', 'text')
    .addColumn('traits', 'jsonb', (c) => c.notNull())
    .addColumn('sources', 'jsonb', (c) => c.notNull().defaultTo(sql`'{}'::jsonb`))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addCheckConstraint('species_owner', sql`(bank_id is null) = (ref_key is not null)`)
    .execute();
  await sql`create unique index species_bank_name_key on species (bank_id, lower(common_name), lower(scientific_name)) where bank_id is not null`.execute(
    db,
  );

  // A bank's own values for a reference species' traits, merged over the reference values.
  await db.schema
    .createTable('species_overrides')
    .addColumn('bank_id', 'uuid', (c) => c.notNull().references('banks.id').onDelete('cascade'))
    .addColumn('species_id', 'uuid', (c) => c.notNull().references('species.id').onDelete('cascade'))
    .addColumn('traits', 'jsonb', (c) => c.notNull())
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addPrimaryKeyConstraint('species_overrides_pkey', ['bank_id', 'species_id'])
    .execute();

  await db.schema
    .createTable('photos')
    .addColumn('id', 'uuid', (c) => c.primaryKey())
    .addColumn('bank_id', 'uuid', (c) => c.notNull().references('banks.id').onDelete('cascade'))
    .addColumn('subject', 'text', (c) => c.notNull().check(sql`subject in ('lot', 'plant', 'tray')`))
    .addColumn('subject_id', 'uuid', (c) => c.notNull())
    .addColumn('full_key', 'text', (c) => c.notNull())
    .addColumn('thumb_key', 'text', (c) => c.notNull())
    .addColumn('width', 'integer', (c) => c.notNull())
    .addColumn('height', 'integer', (c) => c.notNull())
    .addColumn('bytes', 'integer', (c) => c.notNull())
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  // Object keys whose rows are gone, written in the same transaction that removes the rows and
  // cleared once the objects are deleted, so a store outage never leaves an orphan behind.
  await db.schema
    .createTable('object_deletions')
    .addColumn('key', 'text', (c) => c.primaryKey())
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  await db.schema.createIndex('photos_subject_idx').on('photos').columns(['subject', 'subject_id']).execute();

  await db.schema
    .createTable('parent_plants')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('bank_id', 'uuid', (c) => c.notNull().references('banks.id').onDelete('cascade'))
    .addColumn('species_id', 'uuid', (c) => c.notNull().references('species.id'))
    .addColumn('label', 'text', (c) => c.notNull())
    .addColumn('variety', 'text')
    .addColumn('location', 'text')
    .addColumn('season', 'integer', (c) => c.check(sql`season between 1900 and 2100`))
    .addColumn('hybrid', 'boolean', (c) => c.notNull().defaultTo(false))
    .addColumn('notes', 'text')
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('parent_plants_bank_idx').on('parent_plants').column('bank_id').execute();

  await db.schema
    .createTable('lots')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('bank_id', 'uuid', (c) => c.notNull().references('banks.id').onDelete('cascade'))
    .addColumn('species_id', 'uuid', (c) => c.notNull().references('species.id'))
    .addColumn('code', 'text', (c) => c.notNull())
    .addColumn('variety', 'text', (c) => c.notNull())
    .addColumn('origin', 'text', (c) => c.notNull().check(sql`origin in ('saved', 'swapped', 'bought')`))
    .addColumn('source_name', 'text')
    .addColumn('harvest_date', 'date')
    .addColumn('packed_for_season', 'integer', (c) => c.check(sql`packed_for_season between 1900 and 2100`))
    .addColumn('plants_bulked', 'integer', (c) => c.check(sql`plants_bulked >= 1`))
    .addColumn('storage_place', 'text', (c) =>
      c.check(sql`storage_place in ('room', 'fridge', 'freezer', 'other')`),
    )
    .addColumn('storage_location', 'text')
    .addColumn('storage_temp_c', 'numeric')
    .addColumn('storage_humidity_pct', 'numeric', (c) => c.check(sql`storage_humidity_pct between 0 and 100`))
    .addColumn('quantity_estimated', 'boolean', (c) => c.notNull().defaultTo(false))
    .addColumn('grams_entered', 'numeric')
    .addColumn('status', 'text', (c) =>
      c
        .notNull()
        .defaultTo('active')
        .check(sql`status in ('active', 'depleted', 'retired')`),
    )
    .addColumn('notes', 'text')
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addCheckConstraint('lots_dated', sql`harvest_date is not null or packed_for_season is not null`)
    .execute();
  await sql`create unique index lots_bank_code_key on lots (bank_id, lower(code))`.execute(db);

  await db.schema
    .createTable('lot_parents')
    .addColumn('lot_id', 'uuid', (c) => c.notNull().references('lots.id').onDelete('cascade'))
    .addColumn('parent_plant_id', 'uuid', (c) =>
      c.notNull().references('parent_plants.id').onDelete('cascade'),
    )
    .addPrimaryKeyConstraint('lot_parents_pkey', ['lot_id', 'parent_plant_id'])
    .execute();

  // Stock is a ledger: seeds on hand is the sum of a lot's movements, never an editable number.
  await db.schema
    .createTable('stock_movements')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('lot_id', 'uuid', (c) => c.notNull().references('lots.id').onDelete('cascade'))
    .addColumn('kind', 'text', (c) =>
      c.notNull().check(sql`kind in ('initial', 'sown', 'given', 'swapped-in', 'test', 'correction')`),
    )
    .addColumn('change', 'integer', (c) => c.notNull().check(sql`change <> 0`))
    .addColumn('date', 'date', (c) => c.notNull())
    .addColumn('reason', 'text', (c) => c.notNull())
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('stock_movements_lot_idx').on('stock_movements').column('lot_id').execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const table of [
    'stock_movements',
    'lot_parents',
    'lots',
    'parent_plants',
    'photos',
    'object_deletions',
    'species_overrides',
    'species',
  ]) {
    await db.schema.dropTable(table).execute();
  }
}
