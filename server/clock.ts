import { DAY_MS, dayIn } from '../shared/dates';
import type { DbOrTx } from './db/database';

/** The app's only source of "now", so tests can move time. */
export interface Clock {
  now(): Date;
}

export const systemClock: Clock = { now: () => new Date() };

/** A clock for tests: starts at `start` and moves only when told. */
export function createTestClock(
  start: Date | string,
): Clock & { set(at: Date | string): void; advanceDays(days: number): void } {
  let current = new Date(start);
  return {
    now: () => new Date(current),
    set(at) {
      current = new Date(at);
    },
    advanceDays(days) {
      current = new Date(current.getTime() + days * DAY_MS);
    },
  };
}

/**
 * Today's calendar date (YYYY-MM-DD) on the bank's own wall clock, in its `time_zone`: a date after
 * it is in the future for the bank's members, so a harvest, count or sowing cannot carry it.
 */
export async function bankToday(db: DbOrTx, clock: Clock, bankId: string): Promise<string> {
  const bank = await db
    .selectFrom('banks')
    .select('time_zone')
    .where('id', '=', bankId)
    .executeTakeFirstOrThrow();
  return todayInZone(clock, bank.time_zone);
}

/** The same day, for a caller that has already read the bank's `time_zone`. */
export const todayInZone = (clock: Clock, timeZone: string): string => dayIn(timeZone, clock.now());
