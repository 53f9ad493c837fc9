import { addDays, frostDateIn } from '#shared/dates';
import { isoDateSchema } from '#shared/schemas/common';

/** A first guess at the coming sowing date: eight weeks before the last spring frost (Hilum's rule). */
export const WEEKS_BEFORE_FROST = 8;
/** Without a frost date, a season ahead (Hilum's rule). */
export const DAYS_AHEAD_WITHOUT_FROST = 90;

/**
 * The coming sowing date: eight weeks before the next last-frost date whose sowing day is still
 * ahead (today counts), or today + 90 days when the bank has no frost date.
 * `lastFrost` is the bank's "MM-DD"; `today` is the bank's calendar day.
 */
export function defaultSowingDate(lastFrost: string | null, today: string): string {
  if (!lastFrost || !/^\d{2}-\d{2}$/.test(lastFrost)) return addDays(today, DAYS_AHEAD_WITHOUT_FROST);
  const year = Number(today.slice(0, 4));
  for (const y of [year, year + 1, year + 2]) {
    const frost = frostDateIn(y, lastFrost);
    const sow = addDays(frost, -7 * WEEKS_BEFORE_FROST);
    if (sow >= today) return sow;
  }
  return addDays(today, DAYS_AHEAD_WITHOUT_FROST);
}

/** A sowing date from the address (`?on=`), when it is a real calendar date. */
export function parseSowingDate(value: string | null): string | undefined {
  const parsed = isoDateSchema.safeParse(value);
  return parsed.success ? parsed.data : undefined;
}
