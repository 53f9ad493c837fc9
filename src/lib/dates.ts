import { dayInWords } from '#shared/day-words';
import { dayIn } from '#shared/dates';

/** Today's calendar date, YYYY-MM-DD, on the bank's calendar: pass the bank's `timeZone`. */
export function todayIn(timeZone: string): string {
  return dayIn(timeZone, new Date());
}

/** An ISO date in words for a table ("14 Sep 2025"), read as a calendar day. */
export const formatDay = dayInWords;
