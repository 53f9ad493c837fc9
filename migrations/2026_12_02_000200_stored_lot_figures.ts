import { type Kysely, sql } from 'kysely';

// What every list of lots reads, kept on the lot row by the database itself so a list is one plain
// select: seeds on hand (the sum of the stock ledger, which stays the source of truth), the parent
// plants and the first packet photo. Each trigger recomputes the figure of the lots a write touched
// from the source rows, so the stored value cannot drift from them.
//
// And one stamp per bank and species that moves whenever anything a viability fit reads changes
// (a test's stored result, status, dates or set-aside reason; a lot's dates, storage or species),
// so a fitted model kept in memory is known current by comparing one number.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable('lots')
    .addColumn('seeds_on_hand', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('parent_plant_ids', sql`uuid[]`, (c) => c.notNull().defaultTo(sql`'{}'`))
    .addColumn('first_photo_id', 'uuid')
    .execute();

  await sql`
    create function lots_refresh_seeds_on_hand() returns trigger language plpgsql as $$
    begin
      if tg_op in ('INSERT', 'UPDATE') then
        update lots set seeds_on_hand = (select coalesce(sum(change), 0) from stock_movements where lot_id = new.lot_id)
        where id = new.lot_id;
      end if;
      if tg_op in ('DELETE', 'UPDATE') and (tg_op = 'DELETE' or old.lot_id <> new.lot_id) then
        update lots set seeds_on_hand = (select coalesce(sum(change), 0) from stock_movements where lot_id = old.lot_id)
        where id = old.lot_id;
      end if;
      return null;
    end $$`.execute(db);
  await sql`
    create trigger stock_movements_seeds_on_hand after insert or update or delete on stock_movements
    for each row execute function lots_refresh_seeds_on_hand()`.execute(db);

  await sql`
    create function lots_refresh_parent_plant_ids() returns trigger language plpgsql as $$
    declare
      affected uuid;
    begin
      foreach affected in array array_remove(array[
        case when tg_op <> 'DELETE' then new.lot_id end,
        case when tg_op <> 'INSERT' then old.lot_id end], null)
      loop
        update lots set parent_plant_ids = (
          select coalesce(array_agg(parent_plant_id order by parent_plant_id), '{}') from lot_parents where lot_id = affected)
        where id = affected;
      end loop;
      return null;
    end $$`.execute(db);
  await sql`
    create trigger lot_parents_parent_plant_ids after insert or update or delete on lot_parents
    for each row execute function lots_refresh_parent_plant_ids()`.execute(db);

  await sql`
    create function lots_refresh_first_photo() returns trigger language plpgsql as $$
    declare
      affected uuid;
    begin
      foreach affected in array array_remove(array[
        case when tg_op <> 'DELETE' and new.subject = 'lot' then new.subject_id end,
        case when tg_op <> 'INSERT' and old.subject = 'lot' then old.subject_id end], null)
      loop
        update lots set first_photo_id = (
          select id from photos where subject = 'lot' and subject_id = affected order by created_at, id limit 1)
        where id = affected;
      end loop;
      return null;
    end $$`.execute(db);
  await sql`
    create trigger photos_first_photo after insert or update or delete on photos
    for each row execute function lots_refresh_first_photo()`.execute(db);

  await sql`
    update lots set
      seeds_on_hand = (select coalesce(sum(change), 0) from stock_movements m where m.lot_id = lots.id),
      parent_plant_ids = (select coalesce(array_agg(parent_plant_id order by parent_plant_id), '{}') from lot_parents p where p.lot_id = lots.id),
      first_photo_id = (select id from photos where subject = 'lot' and subject_id = lots.id order by created_at, id limit 1)`.execute(
    db,
  );

  await db.schema
    .createTable('viability_stamps')
    .addColumn('bank_id', 'uuid', (c) => c.notNull().references('banks.id').onDelete('cascade'))
    .addColumn('species_id', 'uuid', (c) => c.notNull().references('species.id').onDelete('cascade'))
    .addColumn('stamp', 'bigint', (c) => c.notNull())
    .addPrimaryKeyConstraint('viability_stamps_pkey', ['bank_id', 'species_id'])
    .execute();
  await sql`create sequence viability_stamp_seq`.execute(db);
  await sql`
    create function viability_stamp_bump(bank uuid, sp uuid) returns void language sql as $$
      -- Nothing to stamp while the bank itself is being deleted (its rows go with it).
      insert into viability_stamps (bank_id, species_id, stamp)
      select bank, sp, nextval('viability_stamp_seq') where exists (select 1 from banks where id = bank)
      on conflict (bank_id, species_id) do update set stamp = excluded.stamp
    $$`.execute(db);
  await sql`
    create function viability_stamp_tests() returns trigger language plpgsql as $$
    begin
      if tg_op <> 'INSERT' then
        perform viability_stamp_bump(l.bank_id, l.species_id) from lots l where l.id = old.lot_id;
      end if;
      if tg_op <> 'DELETE' then
        perform viability_stamp_bump(l.bank_id, l.species_id) from lots l where l.id = new.lot_id;
      end if;
      return null;
    end $$`.execute(db);
  await sql`
    create trigger germination_tests_viability_stamp after insert or update or delete on germination_tests
    for each row execute function viability_stamp_tests()`.execute(db);
  await sql`
    create function viability_stamp_lots() returns trigger language plpgsql as $$
    begin
      if tg_op = 'UPDATE' and (old.species_id, old.harvest_date, old.packed_for_season, old.storage_place, old.storage_temp_c)
          is not distinct from (new.species_id, new.harvest_date, new.packed_for_season, new.storage_place, new.storage_temp_c) then
        return null;
      end if;
      if tg_op <> 'INSERT' then
        perform viability_stamp_bump(old.bank_id, old.species_id);
      end if;
      if tg_op <> 'DELETE' then
        perform viability_stamp_bump(new.bank_id, new.species_id);
      end if;
      return null;
    end $$`.execute(db);
  await sql`
    create trigger lots_viability_stamp after insert or update or delete on lots
    for each row execute function viability_stamp_lots()`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`drop trigger lots_viability_stamp on lots`.execute(db);
  await sql`drop trigger germination_tests_viability_stamp on germination_tests`.execute(db);
  await sql`drop function viability_stamp_lots()`.execute(db);
  await sql`drop function viability_stamp_tests()`.execute(db);
  await sql`drop function viability_stamp_bump(uuid, uuid)`.execute(db);
  await sql`drop sequence viability_stamp_seq`.execute(db);
  await db.schema.dropTable('viability_stamps').execute();
  await sql`drop trigger photos_first_photo on photos`.execute(db);
  await sql`drop trigger lot_parents_parent_plant_ids on lot_parents`.execute(db);
  await sql`drop trigger stock_movements_seeds_on_hand on stock_movements`.execute(db);
  await sql`drop function lots_refresh_first_photo()`.execute(db);
  await sql`drop function lots_refresh_parent_plant_ids()`.execute(db);
  await sql`drop function lots_refresh_seeds_on_hand()`.execute(db);
  await db.schema
    .alterTable('lots')
    .dropColumn('seeds_on_hand')
    .dropColumn('parent_plant_ids')
    .dropColumn('first_photo_id')
    .execute();
}
