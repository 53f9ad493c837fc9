import { addDays } from '#shared/dates';
import { comingSeason } from '#shared/plan-dates';
import { keyedLinkTokens } from '#server/auth/tokens';
import { bankToday, type Clock } from '#server/clock';
import type { Db } from '#server/db/database';
import { notFound } from '#server/http/errors';
import type { ExtraEvent, PlanService } from '../plan/plan.service';
import { runningAssays } from '../reminders/reminders.shared.repository';
import { checkDays } from '../reminders/reminders.service';
import { listSpecies } from '../species/species.shared.repository';
import * as repo from './calendar.repository';
import { dayInWords } from '#shared/day-words';

export interface CalendarDeps {
  db: Db;
  clock: Clock;
  plan: PlanService;
  /** The server's secret: a feed's token is its HMAC of the feed's stored nonce. */
  secret: string;
  appOrigin: string;
}

/**
 * Each member's private, cookie-free calendar feed of a bank: the plan as the one-off download
 * has it (PlanService.calendar) and the running tests' check days. Only a hash of the token is
 * stored to find the feed by; the token itself is an HMAC of a stored random nonce under the
 * server's secret, so the member can be shown the same address again, and the database alone
 * does not give it away. A rotation draws a new nonce, and the old address then answers 404.
 */
export function createCalendarService({ db, clock, plan, secret, appOrigin }: CalendarDeps) {
  const { tokenOf, fresh, hashOf } = keyedLinkTokens(secret, 'hilum calendar feed');
  const urlOf = (token: string) => `${appOrigin}/api/calendar/${token}.ics`;

  /** The check days of the bank's running germination tests, one event each. */
  async function checkDayEvents(bankId: string): Promise<ExtraEvent[]> {
    const running = await runningAssays(db, bankId);
    if (running.length === 0) return [];
    const species = new Map((await listSpecies(db, bankId)).map((s) => [s.id, s]));
    return running.flatMap((t) => {
      const sp = species.get(t.species_id);
      return checkDays(sp?.traits.firstCountDay ?? null, sp?.traits.finalCountDay ?? null).map((day) => {
        const on = addDays(t.start_date, day);
        return {
          uid: `${t.id}-check-${day}@hilum`,
          title: `Count test ${t.code}${sp ? ` (${sp.commonName})` : ''}, day ${day}`,
          from: on,
          to: on,
          description: `Day ${day} of the germination test started ${dayInWords(t.start_date)}: count the normal seedlings in each tray.`,
        };
      });
    });
  }

  return {
    /** The member's feed address, making the feed on first use. */
    async url(bankId: string, userId: string): Promise<string> {
      let feed = await repo.feedOf(db, bankId, userId);
      if (!feed) {
        await repo.insertFeedIfNone(db, { bank_id: bankId, user_id: userId, ...fresh() });
        feed = await repo.feedOf(db, bankId, userId);
      }
      if (!feed) throw notFound('No such bank.');
      return urlOf(tokenOf(feed.nonce));
    },

    /** A new address for the member's feed; the old one stops answering. */
    async rotate(bankId: string, userId: string): Promise<string> {
      const row = fresh();
      await repo.saveFeed(db, { bank_id: bankId, user_id: userId, ...row });
      return urlOf(tokenOf(row.nonce));
    },

    /** The feed a token opens, as iCalendar text; 404 for a token unknown, rotated away or of a former member. */
    async feed(token: string): Promise<string> {
      const gone = () => notFound('No such calendar feed.');
      const hash = hashOf(token);
      if (!hash) throw gone();
      const feed = await repo.feedByHash(db, hash);
      if (!feed) throw gone();
      const season = comingSeason(await bankToday(db, clock, feed.bank_id));
      return plan.calendar(feed.bank_id, season, await checkDayEvents(feed.bank_id));
    },
  };
}

export type CalendarService = ReturnType<typeof createCalendarService>;
