import { dayInWords } from '../../shared/day-words';
import { localNow } from '../../shared/local-time';

/** Today's calendar date, YYYY-MM-DD, in a time zone (a bank's), or the browser's own. */
export function todayIn(timeZone?: string): string {
  return localNow(new Date(), timeZone).date;
}

/** An ISO date in words for a table ("14 Sep 2025"), read as a calendar day. */
export const formatDay = dayInWords;
