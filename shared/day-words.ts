/*
 * A calendar day in words, the same on the server's sentences and on every screen: "29 Mar 2027".
 * Read as a calendar day (no time zone shift). Month names written out by hand: browsers' and
 * Node's own short names differ ("Sep" or "Sept").
 */
const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** "14 Sep 2025" for "2025-09-14"; anything that is not such a date comes back as it was. */
export function dayInWords(iso: string): string {
  const [y, m, d] = iso.slice(0, 10).split('-').map(Number);
  const month = m ? MONTHS[m - 1] : undefined;
  if (!y || !month || !d) return iso;
  return `${d} ${month} ${y}`;
}

/** "Feb 2026" for "2026-02-14": the month and year a seed test is dated by on a packet. */
export function monthInWords(iso: string): string {
  const [y, m] = iso.slice(0, 7).split('-').map(Number);
  const month = m ? MONTHS[m - 1] : undefined;
  if (!y || !month) return iso;
  return `${month} ${y}`;
}
