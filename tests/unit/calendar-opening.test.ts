import { describe, expect, it } from 'vitest';
import { openingMonth, type CalendarEvent } from '#src/features/planner/components/calendar-events';

// Invented events of a season plan; the rule is Hilum's own (which month a grower should see first).
const event = (from: string, to = from): CalendarEvent => ({
  key: `${from}:${to}`,
  kind: 'sow',
  from,
  to,
  title: 'Sow',
  detail: '',
});

describe('the month the season calendar opens on', () => {
  const season = [event('2026-10-20'), event('2027-03-01', '2027-03-15'), event('2027-04-12', '2027-04-26')];

  it('when nothing falls in this month, then it opens on the next month with something in it, not an empty one', () => {
    expect(openingMonth(season, '2026-12-02')).toBe('2027-03');
  });
  it('when something falls in this month, then it opens on this month', () => {
    expect(openingMonth(season, '2027-03-10')).toBe('2027-03');
    // A window that began last month and runs on still counts for this one.
    expect(openingMonth([event('2027-03-25', '2027-04-08')], '2027-04-02')).toBe('2027-04');
  });
  it('when the season is over, then it opens on its first month; with nothing planned there is no month', () => {
    expect(openingMonth(season, '2027-11-01')).toBe('2026-10');
    expect(openingMonth([], '2027-11-01')).toBeNull();
  });
});
