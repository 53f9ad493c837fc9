const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
const WEEKDAYS = ['Sun', 'Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat'];

const utcOf = (iso: string) => Date.parse(`${iso.slice(0, 10)}T00:00:00Z`);

/** "Tue 1 Dec" for a day in the coming week (a calendar day, no time zone shift). */
export function weekDay(iso: string): string {
  const ms = utcOf(iso);
  if (Number.isNaN(ms)) return iso;
  const d = new Date(ms);
  return `${WEEKDAYS[d.getUTCDay()]} ${d.getUTCDate()} ${MONTHS[d.getUTCMonth()]}`;
}

const countFormat = new Intl.NumberFormat('en-GB');
export const formatCount = (n: number) => countFormat.format(n);

/** "1 tray", "3 trays". */
export const plural = (n: number, one: string, many = `${one}s`) =>
  `${formatCount(n)} ${n === 1 ? one : many}`;
