import { localNow } from '../../shared/local-time';

/** Today's calendar date, YYYY-MM-DD, in a time zone (a bank's), or the browser's own. */
export function todayIn(timeZone?: string): string {
  return localNow(new Date(), timeZone).date;
}

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/**
 * An ISO date in words for a table ("14 Sep 2025"), read as a calendar day (no time zone shift).
 * Written out by hand: browsers' own short month names differ ("Sep" or "Sept").
 */
export function formatDay(iso: string): string {
  const [y, m, d] = iso.slice(0, 10).split('-').map(Number);
  const month = m ? MONTHS[m - 1] : undefined;
  if (!y || !month || !d) return iso;
  return `${d} ${month} ${y}`;
}
