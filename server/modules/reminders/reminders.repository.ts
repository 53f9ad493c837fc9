import { sql, type Insertable } from 'kysely';
import type { DbOrTx } from '#server/db/database';
import type { ReminderTable } from '#server/db/schema';
import { unsownEntries } from '../plan/plan.shared.repository';

type PrefColumn = 'remind_sowing' | 'remind_checks' | 'remind_retest' | 'remind_digest';

/** A member's role and reminder choices in the bank. */
export const memberChoices = (db: DbOrTx, bankId: string, userId: string) =>
  db
    .selectFrom('memberships')
    .select(['role', 'remind_sowing', 'remind_checks', 'remind_retest', 'remind_digest', 'remind_hour'])
    .where('bank_id', '=', bankId)
    .where('user_id', '=', userId)
    .executeTakeFirstOrThrow();

export const setMemberChoices = (
  db: DbOrTx,
  bankId: string,
  userId: string,
  choices: Partial<Record<PrefColumn, boolean | null> & { remind_hour: number }>,
) =>
  db
    .updateTable('memberships')
    .set(choices)
    .where('bank_id', '=', bankId)
    .where('user_id', '=', userId)
    .execute();

/** The bank's members with their reminder choices and hour. */
export const bankMembers = (db: DbOrTx, bankId: string) =>
  db
    .selectFrom('memberships')
    .innerJoin('users', 'users.id', 'memberships.user_id')
    .select([
      'users.id',
      'users.email',
      'users.name',
      'memberships.role',
      'memberships.remind_sowing',
      'memberships.remind_checks',
      'memberships.remind_retest',
      'memberships.remind_digest',
      'memberships.remind_hour',
    ])
    .where('memberships.bank_id', '=', bankId)
    .execute();

/** Unsown plan entries whose sowing window (as the plan dates it now) opened between `earliest` and `today`. */
export const sowingsOpened = async (db: DbOrTx, bankId: string, earliest: string, today: string) =>
  (await unsownEntries(db, bankId)).filter((e) => e.sow_from <= today && e.sow_from >= earliest);

export const runningAssays = (db: DbOrTx, bankId: string) =>
  db
    .selectFrom('germination_tests')
    .innerJoin('lots', 'lots.id', 'germination_tests.lot_id')
    .leftJoin('users', 'users.id', 'germination_tests.run_by')
    .select([
      'germination_tests.id',
      'germination_tests.start_date',
      'germination_tests.run_by',
      'users.name as runner_name',
      'lots.code',
      'lots.species_id',
    ])
    .where('germination_tests.bank_id', '=', bankId)
    .where('germination_tests.status', '=', 'running')
    .execute();

/** A test a check-day reminder is about, as it is now; undefined once deleted. */
export const assayNow = (db: DbOrTx, assayId: string) =>
  db
    .selectFrom('germination_tests')
    .select(['bank_id', 'status', 'run_by'])
    .where('id', '=', assayId)
    .executeTakeFirst();

/**
 * The trays of these tests still counted (not set aside), in order, each with the latest date it
 * was counted or scored on (null before its first count).
 */
export const traysToCount = (db: DbOrTx, assayIds: string[]) =>
  db
    .selectFrom('test_trays')
    .select([
      'test_id',
      'position',
      'seeds_sown',
      // greatest() passes over nulls: a tray counted on some days and scored on none still has a date.
      sql<string | null>`greatest(
        (select max(c.check_date) from tray_counts c where c.tray_id = test_trays.id),
        (select max(s.check_date) from tray_scores s where s.tray_id = test_trays.id))`.as('last_counted'),
    ])
    .where('test_id', 'in', assayIds)
    .where('set_aside_reason', 'is', null)
    .orderBy('position')
    .execute();

/** Unsown plan entries whose sowing window (as the plan dates it now) opens between `from` and `to`. */
export const sowingsOpening = async (db: DbOrTx, bankId: string, from: string, to: string) =>
  (await unsownEntries(db, bankId)).filter((e) => e.sow_from >= from && e.sow_from <= to);

export const allBanks = (db: DbOrTx) => db.selectFrom('banks').select(['id', 'name', 'time_zone']).execute();

/** The new reminder's id, or undefined when one with the same key exists. */
export const insertReminder = (db: DbOrTx, values: Insertable<ReminderTable>) =>
  db
    .insertInto('reminders')
    .values(values)
    .onConflict((oc) => oc.column('dedupe_key').doNothing())
    .returning('id')
    .executeTakeFirst();

/** Claims an unsent reminder not being sent (or whose send began before `staleBefore`). */
export const claimReminder = (db: DbOrTx, reminderId: string, now: Date, staleBefore: Date) =>
  db
    .updateTable('reminders')
    .set({ sending_since: now, attempts: sql`attempts + 1` })
    .where('id', '=', reminderId)
    .where('sent_at', 'is', null)
    .where('skipped_at', 'is', null)
    .where((eb) => eb.or([eb('sending_since', 'is', null), eb('sending_since', '<', staleBefore)]))
    .returning(['subject', 'body', 'user_id', 'kind', 'test_id', 'due_on'])
    .executeTakeFirst();

export const userEmail = (db: DbOrTx, userId: string) =>
  db.selectFrom('users').select('email').where('id', '=', userId).executeTakeFirstOrThrow();

export const releaseReminder = (db: DbOrTx, reminderId: string) =>
  db.updateTable('reminders').set({ sending_since: null }).where('id', '=', reminderId).execute();

export const markReminderSent = (db: DbOrTx, reminderId: string, now: Date) =>
  db
    .updateTable('reminders')
    .set({ sent_at: now, sending_since: null })
    .where('id', '=', reminderId)
    .execute();

/** A claimed reminder found no longer needed at its send: kept, with why, and never sent. */
export const markReminderSkipped = (db: DbOrTx, reminderId: string, now: Date, reason: string) =>
  db
    .updateTable('reminders')
    .set({ skipped_at: now, skip_reason: reason, sending_since: null })
    .where('id', '=', reminderId)
    .execute();
