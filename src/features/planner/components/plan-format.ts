import { addDays, frostDateIn, weekdayOf } from '#shared/dates';

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
const LONG_MONTHS = [
  'January',
  'February',
  'March',
  'April',
  'May',
  'June',
  'July',
  'August',
  'September',
  'October',
  'November',
  'December',
];
const WEEKDAYS = ['Sun', 'Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat'];

const parts = (iso: string) => iso.split('-').map(Number) as [number, number, number];

/** "29 Mar" (no year: the season's year is on the page). */
export function dayMonth(iso: string): string {
  const [, m, d] = parts(iso);
  return `${d} ${MONTHS[m - 1] ?? ''}`;
}

/** "Mon 29 Mar". */
export function weekdayDayMonth(iso: string): string {
  return `${WEEKDAYS[weekday(iso)]} ${dayMonth(iso)}`;
}

/** "29 Mar – 12 Apr", or one day when both ends are the same. */
export function dayRange(from: string, to: string): string {
  return from === to ? dayMonth(from) : `${dayMonth(from)} – ${dayMonth(to)}`;
}

/** "March 2027" for "2027-03". */
export function monthTitle(month: string): string {
  const [y, m] = month.split('-').map(Number) as [number, number];
  return `${LONG_MONTHS[m - 1] ?? ''} ${y}`;
}

/** 0 = Sunday … 6 = Saturday, for an ISO calendar date. */
export const weekday = weekdayOf;

export const monthOf = (iso: string) => iso.slice(0, 7);

export function shiftMonth(month: string, by: number): string {
  const [y, m] = month.split('-').map(Number) as [number, number];
  const index = y * 12 + (m - 1) + by;
  return `${Math.floor(index / 12)}-${String((index % 12) + 1).padStart(2, '0')}`;
}

/** The weeks of a month as rows of seven ISO dates, Monday first, padded with the next and previous months' days. */
export function monthWeeks(month: string): string[][] {
  const first = `${month}-01`;
  const start = addDays(first, -((weekday(first) + 6) % 7));
  const weeks: string[][] = [];
  for (let day = start; monthOf(day) <= month; day = addDays(day, 7)) {
    weeks.push(Array.from({ length: 7 }, (_, i) => addDays(day, i)));
  }
  return weeks;
}

/** The bank's last frost date in a season, or null while the bank has none. */
export function seasonFrost(season: number, lastFrost: string | null): string | null {
  return lastFrost ? frostDateIn(season, lastFrost) : null;
}

export function formatSeeds(n: number): string {
  return new Intl.NumberFormat('en-GB').format(n);
}
