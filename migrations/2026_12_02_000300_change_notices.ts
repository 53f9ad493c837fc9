import { type Kysely, sql } from 'kysely';

// Change notices for what app servers keep in memory between requests (server/db/change-feed.ts):
// at commit, PostgreSQL tells every listening server that a bank's records or the sign-in records
// changed, whichever server or hand-written statement changed them. Identical notices of one
// transaction arrive once, so a bulk write costs one notice per bank.
//
// Channel `hilum_changes`, payloads:
//   `bank <uuid>`  something of that bank changed (its lots, species, photos, plants, tests, plan);
//   `bank *`       a reference species, shared by every bank, changed;
//   `auth`         a session or a membership changed or ended.
// Counts, trays, stock movements and lot parents have no notice of their own: every write to them
// also rewrites their test's stored summary or their lot's stored figures, which give one.

/** Tables whose rows belong to one bank (`bank_id`); the bank row itself is `banks.id`. */
const BANK_TABLES = [
  'lots',
  'species',
  'species_overrides',
  'photos',
  'parent_plants',
  'germination_tests',
  'plan_entries',
] as const;

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    create function change_notice_bank() returns trigger language plpgsql as $$
    declare
      before_id text := case when tg_op <> 'INSERT' then to_jsonb(old) ->> tg_argv[0] end;
      after_id text := case when tg_op <> 'DELETE' then to_jsonb(new) ->> tg_argv[0] end;
    begin
      if tg_op <> 'INSERT' then
        perform pg_notify('hilum_changes', 'bank ' || coalesce(before_id, '*'));
      end if;
      if tg_op <> 'DELETE' and after_id is distinct from before_id then
        perform pg_notify('hilum_changes', 'bank ' || coalesce(after_id, '*'));
      end if;
      return null;
    end $$`.execute(db);
  for (const table of BANK_TABLES) {
    await sql`
      create trigger ${sql.id(`${table}_change_notice`)} after insert or update or delete on ${sql.id(table)}
      for each row execute function change_notice_bank('bank_id')`.execute(db);
  }
  await sql`
    create trigger banks_change_notice after update or delete on banks
    for each row execute function change_notice_bank('id')`.execute(db);

  await sql`
    create function change_notice_auth() returns trigger language plpgsql as $$
    begin
      perform pg_notify('hilum_changes', 'auth');
      return null;
    end $$`.execute(db);
  // A new session needs no notice: nobody can have kept it yet.
  await sql`
    create trigger sessions_change_notice after update or delete on sessions
    for each row execute function change_notice_auth()`.execute(db);
  await sql`
    create trigger memberships_change_notice after insert or update or delete on memberships
    for each row execute function change_notice_auth()`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`drop trigger memberships_change_notice on memberships`.execute(db);
  await sql`drop trigger sessions_change_notice on sessions`.execute(db);
  await sql`drop function change_notice_auth()`.execute(db);
  await sql`drop trigger banks_change_notice on banks`.execute(db);
  for (const table of BANK_TABLES) {
    await sql`drop trigger ${sql.id(`${table}_change_notice`)} on ${sql.id(table)}`.execute(db);
  }
  await sql`drop function change_notice_bank()`.execute(db);
}
