// The calendar date and hour on a wall clock in a given time zone. Pure and shared: the server
// uses it for "today" in a bank's time zone, the browser for the same date in its forms.

export interface LocalTime {
  /** YYYY-MM-DD */
  date: string;
  /** 0–23 */
  hour: number;
  /** 0 = Sunday … 6 = Saturday */
  weekday: number;
}

const WEEKDAYS = ['Sun', 'Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat'];

/** The date, hour and weekday at `now` in `timeZone` (an IANA name), or the runtime's own zone. */
export function localNow(now: Date, timeZone?: string): LocalTime {
  const parts = Object.fromEntries(
    // en-CA writes the parts as digits we can join into YYYY-MM-DD.
    new Intl.DateTimeFormat('en-CA', {
      timeZone,
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      hourCycle: 'h23',
      weekday: 'short',
    })
      .formatToParts(now)
      .map((p) => [p.type, p.value]),
  );
  const weekday = WEEKDAYS.indexOf(parts.weekday ?? 'Sun');
  return { date: `${parts.year}-${parts.month}-${parts.day}`, hour: Number(parts.hour), weekday };
}
