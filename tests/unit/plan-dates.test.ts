import { describe, expect, it } from 'vitest';
import { EMPTY_TRAITS } from '#shared/schemas/species';
import { addDays } from '#shared/dates';
import { PlanDateError, comingSeason, planDates } from '#shared/plan-dates';

const petunia = {
  ...EMPTY_TRAITS,
  startMethod: 'indoor' as const,
  startWeeksFrom: 12,
  startWeeksTo: 10,
  firstCountDay: 7,
  finalCountDay: 14,
};

describe('sowing dates back from the frost date', () => {
  it('when a slow bedding flower is started 10–12 weeks before a 05-24 frost, then the window is worked out by hand', () => {
    // Common practice: slow bedding flowers are started 8–12 weeks before the last frost.
    // By hand: 12 weeks = 84 days before 2027-05-24 → 2027-03-01 (May 24 − 24 d = Apr 30,
    // − 30 d = Mar 31, − 30 d = Mar 1); 10 weeks = 70 days → 2027-03-15.
    const d = planDates({
      season: 2027,
      lastFrost: '05-24',
      marginDays: 10,
      traits: petunia,
      start: 'indoors',
    });
    expect(d.sowFrom).toBe('2027-03-01');
    expect(d.sowTo).toBe('2027-03-15');
    // Seedlings expected from day 7 to day 14 after the first sowing (count days; from memory).
    expect(d.expectFrom).toBe('2027-03-08');
    expect(d.expectBy).toBe('2027-03-15');
    // Plant out after the frost date plus the 10-day margin, harden off for a week before.
    expect(d.transplantOn).toBe('2027-06-03');
    expect(d.hardenFrom).toBe('2027-05-27');
  });

  it('when the window crosses the end of February in a leap year, then 29 February counts', () => {
    // 2028 is a leap year: 12 weeks before 2028-05-20 is 84 days back → 2028-02-26
    // (May 20 − 20 = Apr 30, − 30 = Mar 31, − 31 = Feb 29, − 3 = Feb 26).
    const leap = planDates({
      season: 2028,
      lastFrost: '05-20',
      marginDays: 0,
      traits: petunia,
      start: 'indoors',
    });
    expect(leap.sowFrom).toBe('2028-02-26');
    // The same in 2027 (common year) lands one day later in the calendar: 2027-02-25.
    const common = planDates({
      season: 2027,
      lastFrost: '05-20',
      marginDays: 0,
      traits: petunia,
      start: 'indoors',
    });
    expect(common.sowFrom).toBe('2027-02-25');
  });

  it('when the frost date is 02-29, then a common year plans from 02-28', () => {
    // The 29 February rule is tested in dates.test.ts; here the plan follows it: 2027-02-28 + 7 days.
    const d = planDates({
      season: 2027,
      lastFrost: '02-29',
      marginDays: 7,
      traits: { ...EMPTY_TRAITS, startMethod: 'direct' },
      start: 'direct',
    });
    expect(d.lastFrost).toBe('2027-02-28');
    expect(d.sowFrom).toBe('2027-03-07');
  });

  it('when sowing direct, then the window opens after the frost date plus margin', () => {
    const d = planDates({
      season: 2027,
      lastFrost: '05-24',
      marginDays: 7,
      traits: { ...EMPTY_TRAITS, startMethod: 'direct' },
      start: 'direct',
    });
    expect(d.sowFrom).toBe('2027-05-31');
    expect(d.sowTo).toBe(addDays('2027-05-31', 21));
    expect(d.transplantOn).toBeNull();
  });

  it('when the bank has no frost date or the species no window, then it says what to set', () => {
    expect(() =>
      planDates({ season: 2027, lastFrost: null, marginDays: 7, traits: petunia, start: 'indoors' }),
    ).toThrow(PlanDateError);
    expect(() =>
      planDates({ season: 2027, lastFrost: '05-24', marginDays: 7, traits: EMPTY_TRAITS, start: 'indoors' }),
    ).toThrow(/indoor start window/);
  });
});

describe('the season planned by default', () => {
  it('when it is spring or summer, then this year’s season; from September, next year’s (Hilum’s rule)', () => {
    expect(comingSeason('2027-03-15')).toBe(2027);
    expect(comingSeason('2026-08-31')).toBe(2026);
    expect(comingSeason('2026-09-01')).toBe(2027);
    expect(comingSeason('2026-12-02')).toBe(2027);
  });
});
