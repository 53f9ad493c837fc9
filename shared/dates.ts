// Calendar days, in one place for the server and the browser. A day is an ISO YYYY-MM-DD string on
// the bank's own calendar (its `time_zone`). Arithmetic runs on UTC midnights, where every day has
// 24 hours, so no daylight-saving change can move a date.
import { localNow } from './local-time';

/** Milliseconds in a day (24 × 60 × 60 × 1000). */
export const DAY_MS = 86_400_000;

/** UTC midnight of a calendar day, in milliseconds. */
const utcMidnight = (date: string) => Date.parse(`${date}T00:00:00Z`);

/** The calendar day `days` after `date` (before it when negative). */
export function addDays(date: string, days: number): string {
  return new Date(utcMidnight(date) + days * DAY_MS).toISOString().slice(0, 10);
}

/** Whole calendar days from `from` to `to` (negative when `to` comes first). */
export function daysBetween(from: string, to: string): number {
  return Math.round((utcMidnight(to) - utcMidnight(from)) / DAY_MS);
}

/** 0 = Sunday … 6 = Saturday, for a calendar day. */
export function weekdayOf(date: string): number {
  return new Date(utcMidnight(date)).getUTCDay();
}

/** Gregorian rule: every fourth year, except centuries, except every fourth century. */
export function isLeapYear(year: number): boolean {
  return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
}

/** A month and day ("MM-DD") in a given year; 29 February is 28 February in a common year (Hilum's rule). */
export function dateInYear(year: number, monthDay: string): string {
  const [m, d] = monthDay.split('-').map(Number) as [number, number];
  const day = m === 2 && d === 29 && !isLeapYear(year) ? 28 : d;
  return `${String(year).padStart(4, '0')}-${String(m).padStart(2, '0')}-${String(day).padStart(2, '0')}`;
}

/** The bank's median last-frost date ("MM-DD") in a season's year, by the 29 February rule above. */
export const frostDateIn = (season: number, lastFrost: string): string => dateInYear(season, lastFrost);

/** The same calendar date `years` on (29 February lands on 28 February in a common year). */
export const addYears = (date: string, years: number): string =>
  dateInYear(Number(date.slice(0, 4)) + years, date.slice(5));

/**
 * The calendar day at the instant `at` on the wall clock of `timeZone` (an IANA name). "Today" in
 * Hilum is always the bank's day: pass the bank's `time_zone` and the caller's clock.
 */
export const dayIn = (timeZone: string, at: Date): string => localNow(at, timeZone).date;
