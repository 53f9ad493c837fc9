const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
const WEEKDAYS = ['Sun', 'Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat'];
const DAY_MS = 86_400_000;

const utcOf = (iso: string) => Date.parse(`${iso.slice(0, 10)}T00:00:00Z`);

/** "Tue 1 Dec" for a day in the coming week (a calendar day, no time zone shift). */
export function weekDay(iso: string): string {
  const ms = utcOf(iso);
  if (Number.isNaN(ms)) return iso;
  const d = new Date(ms);
  return `${WEEKDAYS[d.getUTCDay()]} ${d.getUTCDate()} ${MONTHS[d.getUTCMonth()]}`;
}

/** "1 Dec 2026": a day that may lie in another year. */
export function fullDay(iso: string): string {
  const ms = utcOf(iso);
  if (Number.isNaN(ms)) return iso;
  const d = new Date(ms);
  return `${d.getUTCDate()} ${MONTHS[d.getUTCMonth()]} ${d.getUTCFullYear()}`;
}

/** Whole calendar days from one ISO date to another. */
export function daysFrom(from: string, to: string): number {
  return Math.round((utcOf(to) - utcOf(from)) / DAY_MS);
}

/** The server's reasons name dates as YYYY-MM-DD; the screen writes them in words. */
export function datesInWords(text: string): string {
  return text.replace(/\b\d{4}-\d{2}-\d{2}\b/g, (iso) => fullDay(iso));
}

const countFormat = new Intl.NumberFormat('en-GB');
export const formatCount = (n: number) => countFormat.format(n);

/** "1 tray", "3 trays". */
export const plural = (n: number, one: string, many = `${one}s`) =>
  `${formatCount(n)} ${n === 1 ? one : many}`;
