import { dayInWords } from '#shared/day-words';
import type { z } from 'zod';
import { hourWords, type reminderPrefsBodySchema } from '#shared/schemas/reminders';
import { addDays, daysBetween } from '#shared/dates';
import { localNow } from '#shared/local-time';
import { roleAtLeast } from '#server/auth/bank-access';
import type { Clock } from '#server/clock';
import type { Db, DbOrTx } from '#server/db/database';
import { createReminderQueue, type ReminderQueueOptions } from '#server/jobs/reminders';
import type { ReminderKind, Role } from '#server/db/schema';
import type { Mailer } from '#server/mail/mailer';
import { listSpecies } from '../species/species.shared.repository';
import type { ViabilityService } from '../viability/viability.service';
import * as repo from './reminders.repository';

/** A reminder missed while the server was down is still sent for this many days. */
const CATCH_UP_DAYS = 2;
/** A send that has not finished within this time is taken to have died, and may be retried. */
const SENDING_TIMEOUT_MS = 10 * 60 * 1000;

/** A member's choice, or the role's default: on for owner and grower, off for viewer. */
export const wantsReminder = (role: Role, choice: boolean | null) => choice ?? role !== 'viewer';

/** The days a running test is counted on: the first and final count days, and one between (common practice). */
export function checkDays(first: number | null, final: number | null): number[] {
  if (first == null || final == null) return first != null ? [first] : [];
  return [...new Set([first, Math.round((first + final) / 2), final])];
}

type MemberRow = Awaited<ReturnType<typeof repo.bankMembers>>[number];

/** A member as the reminders see them: whom to write to, which kinds they want, and from what hour. */
export interface Recipient {
  id: string;
  email: string;
  name: string;
  role: Role;
  hour: number;
  wants: Record<ReminderKind, boolean>;
}

const recipientOf = (m: MemberRow): Recipient => ({
  id: m.id,
  email: m.email,
  name: m.name,
  role: m.role,
  hour: m.remind_hour,
  wants: {
    sowing: wantsReminder(m.role, m.remind_sowing),
    check: wantsReminder(m.role, m.remind_checks),
    retest: wantsReminder(m.role, m.remind_retest),
    digest: wantsReminder(m.role, m.remind_digest),
  },
});

/**
 * Whom a test's check-day reminder is for: the member running it while they may count it (an
 * owner or grower of the bank); when they left the bank, became a viewer or their account is gone,
 * the bank's owners, who can hand the test to someone else.
 */
export function checkRecipients<M extends { id: string; role: Role }>(
  members: M[],
  runBy: string | null,
): M[] {
  const runner = members.find((m) => m.id === runBy && roleAtLeast(m.role, 'grower'));
  return runner ? [runner] : members.filter((m) => m.role === 'owner');
}

/**
 * Whether a check day's counts are saved: every tray still in the test has a count or a rough
 * score dated that day or later (a later count covers a day missed). A test whose trays are all
 * set aside has nothing to count.
 */
export const dayCounted = (trays: { last_counted: string | null }[], on: string) =>
  trays.every((t) => t.last_counted !== null && t.last_counted >= on);

/** Why a check-day reminder came to this member: they run the test, or stand in as an owner. */
const whyYouCount = (memberId: string, runBy: string | null) =>
  memberId === runBy
    ? 'You get this because you run this test; another grower can take it over on its page.'
    : 'You get this as an owner: whoever ran this test can no longer count it. Hand it to a grower on its page.';

/** The member's reminder choices in the bank, defaults filled in. */
export async function reminderPreferences(db: DbOrTx, bankId: string, userId: string) {
  const m = await repo.memberChoices(db, bankId, userId);
  return {
    sowing: wantsReminder(m.role, m.remind_sowing),
    checks: wantsReminder(m.role, m.remind_checks),
    retest: wantsReminder(m.role, m.remind_retest),
    digest: wantsReminder(m.role, m.remind_digest),
    hour: m.remind_hour,
  };
}

/** Stores the choices given and returns them all. */
export async function setReminderPreferences(
  db: DbOrTx,
  bankId: string,
  userId: string,
  body: z.infer<typeof reminderPrefsBodySchema>,
) {
  await repo.setMemberChoices(db, bankId, userId, {
    ...(body.sowing !== undefined ? { remind_sowing: body.sowing } : {}),
    ...(body.checks !== undefined ? { remind_checks: body.checks } : {}),
    ...(body.retest !== undefined ? { remind_retest: body.retest } : {}),
    ...(body.digest !== undefined ? { remind_digest: body.digest } : {}),
    ...(body.hour !== undefined ? { remind_hour: body.hour } : {}),
  });
  return reminderPreferences(db, bankId, userId);
}

interface Due {
  key: string;
  bankId: string;
  kind: ReminderKind;
  dueOn: string;
  subject: string;
  body: string;
  /** A check day's test, and who runs it: the reminder is theirs alone (checkRecipients). */
  check?: { testId: string; runBy: string | null };
}

export interface RemindersServiceDeps {
  db: Db;
  mailer: Mailer;
  clock: Clock;
  appOrigin: string;
  viability: ViabilityService;
}

/**
 * What is due on each bank's calendar, turned into reminder rows unique by what they are about,
 * and the sending of one row at most once. The queue that carries the rows is the caller's.
 */
export function createRemindersService(deps: RemindersServiceDeps) {
  const { db, clock, mailer } = deps;

  const members = async (bankId: string) => (await repo.bankMembers(db, bankId)).map(recipientOf);

  /** Why a claimed check-day reminder is no longer wanted, or null while it still is. */
  async function checkNoLongerNeeded(testId: string, userId: string, dueOn: string): Promise<string | null> {
    const test = await repo.assayNow(db, testId);
    if (!test || test.status !== 'running') return 'the test is no longer running';
    const to = checkRecipients(await members(test.bank_id), test.run_by);
    if (!to.some((m) => m.id === userId)) return 'someone else runs the test now';
    if (dayCounted(await repo.traysToCount(db, [testId]), dueOn)) return 'the day was counted';
    return null;
  }

  async function dueForBank(
    bank: { id: string; name: string; time_zone: string },
    today: string,
    weekday: number,
  ): Promise<Due[]> {
    const due: Due[] = [];
    const link = (path: string) => `${deps.appOrigin}/banks/${bank.id}${path}`;
    const earliest = addDays(today, -CATCH_UP_DAYS);

    const sowings = await repo.sowingsOpened(db, bank.id, earliest, today);
    for (const e of sowings) {
      const what = `${e.common_name}${e.code ? ` (${e.code})` : ''}`;
      due.push({
        key: `sowing:${e.id}`,
        bankId: bank.id,
        kind: 'sowing',
        dueOn: e.sow_from,
        subject: `Sowing time: ${what}`,
        body: [
          `The sowing window for ${what} opened on ${dayInWords(e.sow_from)} and runs until ${dayInWords(e.sow_to)}${e.start === 'indoors' ? ', indoors' : ', sown direct'}.`,
          e.seeds_to_sow
            ? `Sow ${e.seeds_to_sow} seeds for ${e.plants_wanted} plants.`
            : `${e.plants_wanted} plants wanted.`,
          '',
          `The plan: ${link('/planner')}`,
        ].join('\n'),
      });
    }

    const species = new Map((await listSpecies(db, bank.id)).map((s) => [s.id, s]));
    const running = await repo.runningAssays(db, bank.id);
    const trays = running.length
      ? await repo.traysToCount(
          db,
          running.map((t) => t.id),
        )
      : [];
    for (const t of running) {
      const sp = species.get(t.species_id);
      for (const day of checkDays(sp?.traits.firstCountDay ?? null, sp?.traits.finalCountDay ?? null)) {
        const on = addDays(t.start_date, day);
        if (on > today || on < earliest) continue;
        const own = trays.filter((tr) => tr.test_id === t.id);
        if (dayCounted(own, on)) continue;
        due.push({
          key: `check:${t.id}:${on}`,
          bankId: bank.id,
          kind: 'check',
          dueOn: on,
          subject: `Count the trays of ${sp?.commonName ?? 'a'} test ${t.code} (day ${day})`,
          body: [
            `Day ${day} of the germination test of lot ${t.code}, started ${dayInWords(t.start_date)}: count the normal seedlings (sound root and shoot) in ${own
              .map(
                (tr) =>
                  `tray ${tr.position} (${tr.seeds_sown === null ? 'seeds not counted' : `${tr.seeds_sown} sown`})`,
              )
              .join(', ')}.`,
            '',
            `Enter the counts: ${link(`/tests/${t.id}`)}`,
          ].join('\n'),
          check: { testId: t.id, runBy: t.run_by },
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
        body: [
          `Lot ${r.code} (${r.species}, ${r.variety}) is due for a germination test (${r.reason})`,
          '',
          `The lot: ${link(`/lots/${r.lotId}`)}`,
        ].join('\n'),
      });
    }

    if (weekday === 1) {
      const weekEnd = addDays(today, 6);
      const lines = [
        ...(await repo.sowingsOpening(db, bank.id, today, weekEnd)).map(
          (e) => `- Sow ${e.common_name} from ${dayInWords(e.sow_from)}`,
        ),
        ...running.flatMap((t) => {
          const sp = species.get(t.species_id);
          return checkDays(sp?.traits.firstCountDay ?? null, sp?.traits.finalCountDay ?? null)
            .map((d) => addDays(t.start_date, d))
            .filter((on) => on >= today && on <= weekEnd)
            .map(
              (on) =>
                `- Count test ${t.code} on ${dayInWords(on)}${t.runner_name ? `, run by ${t.runner_name}` : ''}`,
            );
        }),
        ...ranking
          .filter((r) => r.retestBy && r.retestBy <= weekEnd && daysBetween(r.retestBy, today) < 30)
          .map((r) => `- Retest ${r.code} (${r.species})`),
      ];
      if (lines.length) {
        due.push({
          key: `digest:${bank.id}:${today}`,
          bankId: bank.id,
          kind: 'digest',
          dueOn: today,
          subject: `This week in ${bank.name}`,
          body: [
            `What is due in ${bank.name} from ${dayInWords(today)} to ${dayInWords(weekEnd)}:`,
            '',
            ...lines,
            '',
            `Overview: ${link('/overview')}`,
          ].join('\n'),
        });
      }
    }
    return due;
  }

  return {
    /**
     * Finds what is due now and writes a reminder row for each member who wants it; `enqueue`
     * runs in the row's transaction, so the row and its job commit together. Returns how many
     * reminders were newly queued.
     */
    async queueDue(enqueue: (trx: DbOrTx, reminderId: string) => Promise<void>): Promise<number> {
      const banks = await repo.allBanks(db);
      let queued = 0;
      for (const bank of banks) {
        const now = localNow(clock.now(), bank.time_zone);
        const all = await members(bank.id);
        // Each member's reminders go out from their own hour on the bank's clock.
        const ready = (m: Recipient) => now.hour >= m.hour;
        if (!all.some(ready)) continue;
        for (const item of await dueForBank(bank, now.date, now.weekday)) {
          const to = item.check ? checkRecipients(all, item.check.runBy) : all;
          for (const member of to.filter((m) => ready(m) && m.wants[item.kind])) {
            queued += await db.transaction().execute(async (trx) => {
              const row = await repo.insertReminder(trx, {
                dedupe_key: `${item.key}:${member.id}`,
                bank_id: item.bankId,
                user_id: member.id,
                kind: item.kind,
                due_on: item.dueOn,
                test_id: item.check?.testId ?? null,
                subject: item.subject,
                body: `Hello ${member.name},\n\n${item.body}${item.check ? `\n\n${whyYouCount(member.id, item.check.runBy)}` : ''}\n\nYou get this because reminders of this kind are on for you in ${bank.name}, at ${hourWords(member.hour)} on the bank's clock (${bank.time_zone}); change that under Account → Reminders.`,
              });
              if (!row) return 0;
              await enqueue(trx, row.id);
              return 1;
            });
          }
        }
      }
      return queued;
    },

    /** Sends one reminder at most once: claim, send, mark sent; a failure releases the claim. */
    async deliver(reminderId: string) {
      const claimed = await repo.claimReminder(
        db,
        reminderId,
        new Date(),
        new Date(Date.now() - SENDING_TIMEOUT_MS),
      );
      if (!claimed) return;
      // A count saved, a new runner or a finished test since the reminder was queued: not sent.
      if (claimed.kind === 'check' && claimed.test_id) {
        const why = await checkNoLongerNeeded(claimed.test_id, claimed.user_id, claimed.due_on);
        if (why) {
          await repo.markReminderSkipped(db, reminderId, new Date(), why);
          return;
        }
      }
      const user = await repo.userEmail(db, claimed.user_id);
      try {
        await mailer.send({ to: user.email, subject: claimed.subject, text: claimed.body });
      } catch (error) {
        await repo.releaseReminder(db, reminderId);
        throw error;
      }
      await repo.markReminderSent(db, reminderId, new Date());
    },
  };
}

export type RemindersService = ReturnType<typeof createRemindersService>;

/** The reminders service on its durable queue: what the server starts and the tests drive. */
export function createReminders(deps: RemindersServiceDeps & ReminderQueueOptions) {
  return createReminderQueue(createRemindersService(deps), deps);
}
