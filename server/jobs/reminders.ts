import { CompiledQuery, sql } from 'kysely';
import PgBoss from 'pg-boss';
import type { Logger } from 'pino';
import { localNow } from '../../shared/local-time';
import { addDays, daysBetween } from '../../shared/plan-dates';
import type { Clock } from '../clock';
import type { Db, DbOrTx } from '../db/database';
import type { ReminderKind, Role } from '../db/schema';
import type { Mailer } from '../mail/mailer';
import { listSpecies } from '../modules/species/species.service';
import type { ViabilityService } from '../modules/viability/viability.service';

export const REMINDER_QUEUE = 'send-reminder';
/** Reminders go out from this local hour: "the morning" a sowing window opens. */
export const MORNING_HOUR = 7;
/** A reminder missed while the server was down is still sent for this many days. */
const CATCH_UP_DAYS = 2;
/** A send that has not finished within this time is taken to have died, and may be retried. */
const SENDING_TIMEOUT_MS = 10 * 60 * 1000;

type PrefColumn = 'remind_sowing' | 'remind_checks' | 'remind_retest' | 'remind_digest';
const PREF_OF: Record<ReminderKind, PrefColumn> = {
  sowing: 'remind_sowing',
  check: 'remind_checks',
  retest: 'remind_retest',
  digest: 'remind_digest',
};

/** A member's choice, or the role's default: on for owner and grower, off for viewer. */
export const wantsReminder = (role: Role, choice: boolean | null) => choice ?? role !== 'viewer';

/** The days a running test is counted on: the first and final count days, and one between (common practice). */
export function checkDays(first: number | null, final: number | null): number[] {
  if (first == null || final == null) return first != null ? [first] : [];
  return [...new Set([first, Math.round((first + final) / 2), final])];
}

interface Due {
  key: string;
  bankId: string;
  kind: ReminderKind;
  dueOn: string;
  subject: string;
  body: string;
}

export interface RemindersDeps {
  db: Db;
  databaseUrl: string;
  mailer: Mailer;
  clock: Clock;
  appOrigin: string;
  viability: ViabilityService;
  logger?: Logger;
  /** Seconds before a failed send is retried (doubling each time). */
  retryDelaySeconds?: number;
  pollingIntervalSeconds?: number;
}

/**
 * E-mail reminders on a durable queue. A scan (`tick`) turns what is due on the bank's calendar
 * into reminder rows, unique by what they are about, and queues one pg-boss job per new row in the
 * same transaction. Workers send each row once: a row is claimed before sending and marked sent
 * after, and a failed send is retried with backoff. Rows and jobs live in PostgreSQL, so a restart
 * loses nothing; a reminder missed while the server was down is still found by the next scan.
 */
export function createReminders(deps: RemindersDeps) {
  const { db, clock, mailer } = deps;
  const boss = new PgBoss({ connectionString: deps.databaseUrl, schema: 'pgboss', max: 3, schedule: false, supervise: true });
  boss.on('error', (error) => deps.logger?.error({ err: error }, 'job queue error'));
  let started = false;

  /** pg-boss inserts its job through our transaction, so the row and its job commit together. */
  const inTransaction = (trx: DbOrTx) => ({
    executeSql: async (text: string, values: unknown[]) => {
      const result = await trx.executeQuery(CompiledQuery.raw(text, values));
      return { rows: result.rows as unknown[] };
    },
  });

  async function members(bankId: string, kind: ReminderKind) {
    const rows = await db
      .selectFrom('memberships')
      .innerJoin('users', 'users.id', 'memberships.user_id')
      .select(['users.id', 'users.email', 'users.name', 'memberships.role', `memberships.${PREF_OF[kind]} as choice`])
      .where('memberships.bank_id', '=', bankId)
      .execute();
    return rows.filter((r) => wantsReminder(r.role, r.choice as boolean | null));
  }

  async function dueForBank(bank: { id: string; name: string; time_zone: string }, today: string, weekday: number): Promise<Due[]> {
    const due: Due[] = [];
    const link = (path: string) => `${deps.appOrigin}/banks/${bank.id}${path}`;
    const earliest = addDays(today, -CATCH_UP_DAYS);

    const sowings = await db
      .selectFrom('plan_entries')
      .innerJoin('species', 'species.id', 'plan_entries.species_id')
      .leftJoin('lots', 'lots.id', 'plan_entries.lot_id')
      .select(['plan_entries.id', 'plan_entries.sow_from', 'plan_entries.sow_to', 'plan_entries.seeds_to_sow', 'plan_entries.plants_wanted', 'plan_entries.start', 'species.common_name', 'lots.code'])
      .where('plan_entries.bank_id', '=', bank.id)
      .where('plan_entries.sown_on', 'is', null)
      .where('plan_entries.sow_from', '<=', today)
      .where('plan_entries.sow_from', '>=', earliest)
      .execute();
    for (const e of sowings) {
      const what = `${e.common_name}${e.code ? ` (${e.code})` : ''}`;
      due.push({
        key: `sowing:${e.id}`,
        bankId: bank.id,
        kind: 'sowing',
        dueOn: e.sow_from,
        subject: `Sowing time: ${what}`,
        body: [
          `The sowing window for ${what} opened on ${e.sow_from} and runs until ${e.sow_to}${e.start === 'indoors' ? ', indoors' : ', sown direct'}.`,
          e.seeds_to_sow ? `Sow ${e.seeds_to_sow} seeds for ${e.plants_wanted} plants.` : `${e.plants_wanted} plants wanted.`,
          '',
          `The plan: ${link('/planner')}`,
        ].join('\n'),
      });
    }

    const species = new Map((await listSpecies(db, bank.id)).map((s) => [s.id, s]));
    const running = await db
      .selectFrom('germination_tests')
      .innerJoin('lots', 'lots.id', 'germination_tests.lot_id')
      .select(['germination_tests.id', 'germination_tests.start_date', 'lots.code', 'lots.species_id'])
      .where('germination_tests.bank_id', '=', bank.id)
      .where('germination_tests.status', '=', 'running')
      .execute();
    const trays = running.length
      ? await db
          .selectFrom('test_trays')
          .select(['test_id', 'position', 'seeds_sown'])
          .where('test_id', 'in', running.map((t) => t.id))
          .where('set_aside_reason', 'is', null)
          .orderBy('position')
          .execute()
      : [];
    for (const t of running) {
      const sp = species.get(t.species_id);
      for (const day of checkDays(sp?.traits.firstCountDay ?? null, sp?.traits.finalCountDay ?? null)) {
        const on = addDays(t.start_date, day);
        if (on > today || on < earliest) continue;
        const own = trays.filter((tr) => tr.test_id === t.id);
        due.push({
          key: `check:${t.id}:${on}`,
          bankId: bank.id,
          kind: 'check',
          dueOn: on,
          subject: `Count the trays of ${sp?.commonName ?? 'a'} test ${t.code} (day ${day})`,
          body: [
            `Day ${day} of the germination test of lot ${t.code}, started ${t.start_date}: count the normal seedlings (sound root and shoot) in ${own
              .map((tr) => `tray ${tr.position} (${tr.seeds_sown} sown)`)
              .join(', ')}.`,
            '',
            `Enter the counts: ${link(`/tests/${t.id}`)}`,
          ].join('\n'),
        });
      }
    }

    const ranking = await deps.viability.ranking(bank.id, today);
    for (const r of ranking) {
      if (!r.retestBy || r.retestBy > today || r.retestBy < earliest) continue;
      due.push({
        key: `retest:${r.lotId}:${r.retestBy}`,
        bankId: bank.id,
        kind: 'retest',
        dueOn: r.retestBy,
        subject: `Time to retest ${r.species} ${r.code}`,
        body: [`Lot ${r.code} (${r.species}, ${r.variety}) is due for a germination test (${r.reason})`, '', `The lot: ${link(`/lots/${r.lotId}`)}`].join('\n'),
      });
    }

    if (weekday === 1) {
      const weekEnd = addDays(today, 6);
      const lines = [
        ...(await db
          .selectFrom('plan_entries')
          .innerJoin('species', 'species.id', 'plan_entries.species_id')
          .select(['species.common_name', 'plan_entries.sow_from'])
          .where('plan_entries.bank_id', '=', bank.id)
          .where('plan_entries.sown_on', 'is', null)
          .where('plan_entries.sow_from', '>=', today)
          .where('plan_entries.sow_from', '<=', weekEnd)
          .execute()).map((e) => `- Sow ${e.common_name} from ${e.sow_from}`),
        ...running.flatMap((t) => {
          const sp = species.get(t.species_id);
          return checkDays(sp?.traits.firstCountDay ?? null, sp?.traits.finalCountDay ?? null)
            .map((d) => addDays(t.start_date, d))
            .filter((on) => on >= today && on <= weekEnd)
            .map((on) => `- Count test ${t.code} on ${on}`);
        }),
        ...ranking.filter((r) => r.retestBy && r.retestBy <= weekEnd && daysBetween(r.retestBy, today) < 30).map((r) => `- Retest ${r.code} (${r.species})`),
      ];
      if (lines.length) {
        due.push({
          key: `digest:${bank.id}:${today}`,
          bankId: bank.id,
          kind: 'digest',
          dueOn: today,
          subject: `This week in ${bank.name}`,
          body: [`What is due in ${bank.name} from ${today} to ${weekEnd}:`, '', ...lines, '', `Overview: ${link('/overview')}`].join('\n'),
        });
      }
    }
    return due;
  }

  /** Finds what is due now and queues it; returns how many reminders were newly queued. */
  async function tick(): Promise<number> {
    const banks = await db.selectFrom('banks').select(['id', 'name', 'time_zone']).execute();
    let queued = 0;
    for (const bank of banks) {
      const now = localNow(clock.now(), bank.time_zone);
      if (now.hour < MORNING_HOUR) continue;
      for (const item of await dueForBank(bank, now.date, now.weekday)) {
        for (const member of await members(bank.id, item.kind)) {
          queued += await db.transaction().execute(async (trx) => {
            const row = await trx
              .insertInto('reminders')
              .values({
                dedupe_key: `${item.key}:${member.id}`,
                bank_id: item.bankId,
                user_id: member.id,
                kind: item.kind,
                due_on: item.dueOn,
                subject: item.subject,
                body: `Hello ${member.name},\n\n${item.body}\n\nYou get this because reminders of this kind are on for you in ${bank.name}; change that under Account → Reminders.`,
              })
              .onConflict((oc) => oc.column('dedupe_key').doNothing())
              .returning('id')
              .executeTakeFirst();
            if (!row) return 0;
            await boss.send(
              REMINDER_QUEUE,
              { reminderId: row.id },
              { singletonKey: row.id, retryLimit: 8, retryDelay: deps.retryDelaySeconds ?? 60, retryBackoff: true, db: inTransaction(trx) },
            );
            return 1;
          });
        }
      }
    }
    return queued;
  }

  /** Sends one reminder at most once: claim, send, mark sent; a failure releases the claim. */
  async function deliver(reminderId: string) {
    const claimed = await db
      .updateTable('reminders')
      .set({ sending_since: new Date(), attempts: sql`attempts + 1` })
      .where('id', '=', reminderId)
      .where('sent_at', 'is', null)
      .where((eb) => eb.or([eb('sending_since', 'is', null), eb('sending_since', '<', new Date(Date.now() - SENDING_TIMEOUT_MS))]))
      .returning(['subject', 'body', 'user_id'])
      .executeTakeFirst();
    if (!claimed) return;
    const user = await db.selectFrom('users').select('email').where('id', '=', claimed.user_id).executeTakeFirstOrThrow();
    try {
      await mailer.send({ to: user.email, subject: claimed.subject, text: claimed.body });
    } catch (error) {
      await db.updateTable('reminders').set({ sending_since: null }).where('id', '=', reminderId).execute();
      throw error;
    }
    await db.updateTable('reminders').set({ sent_at: new Date(), sending_since: null }).where('id', '=', reminderId).execute();
  }

  return {
    tick,
    deliver,
    async start() {
      await boss.start();
      started = true;
      await boss.createQueue(REMINDER_QUEUE);
      await boss.work<{ reminderId: string }>(REMINDER_QUEUE, { pollingIntervalSeconds: deps.pollingIntervalSeconds ?? 2, batchSize: 5 }, async (jobs) => {
        for (const job of jobs) await deliver(job.data.reminderId);
      });
    },
    async stop() {
      if (started) await boss.stop({ graceful: true, wait: true, timeout: 5_000 });
      started = false;
    },
  };
}

export type Reminders = ReturnType<typeof createReminders>;
