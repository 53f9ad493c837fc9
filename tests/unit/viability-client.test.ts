import { describe, expect, it } from 'vitest';
import { defaultSowingDate } from '#src/lib/sowing-date';
import { seedAgeYears } from '#shared/seed-age';
import { wilsonScoreInterval as wilsonInterval } from '#shared/wilson';

describe('the shared Wilson interval (the decline chart’s whiskers in the browser)', () => {
  it.each([
    [81, 263, 0.2553, 0.3662], // Newcombe 1998, Stat. Med. 17:857–872, Table II (score method), as quoted in Hilum's issue text
    [0, 20, 0, 0.1611], // Newcombe 1998, Table II, as quoted in Hilum's issue text
  ])('when %i of %i germinate, then the 95 percent bounds match Newcombe 1998', (x, n, low, high) => {
    const interval = wilsonInterval(x, n);
    expect(interval.low).toBeCloseTo(low, 4);
    expect(interval.high).toBeCloseTo(high, 4);
  });

  it('when every seed germinates, then the upper bound is exactly 100 percent', () => {
    // Wilson 1927 score interval: at x = n the upper bound is 1 (algebra).
    expect(wilsonInterval(20, 20).high).toBe(1);
    // And it mirrors 0 of 20: the score interval is symmetric in x and n − x (algebra).
    expect(wilsonInterval(20, 20).low).toBeCloseTo(1 - 0.1611, 4); // Newcombe 1998, Table II, 0 of 20, mirrored
  });
});

describe('seed age', () => {
  it('when four calendar years pass, then the seed is exactly four years older', () => {
    // Gregorian calendar: 14 Sep 2021 to 14 Sep 2025 holds one 29 February, so 1461 days, and the
    // year seed age counts in is the Julian year of 365.25 days (IAU 1976 system of astronomical
    // constants): 1461 / 365.25 = 4.
    expect(seedAgeYears('2021-09-14', '2025-09-14')).toBe(4);
  });

  it('when one calendar year passes, then the age is its days over 365.25', () => {
    // 14 Sep 2023 to 14 Sep 2024 crosses 29 Feb 2024: 366 days; the next year 365 (calendar).
    expect(seedAgeYears('2023-09-14', '2024-09-14')).toBeCloseTo(366 / 365.25, 12);
    expect(seedAgeYears('2024-09-14', '2025-09-14')).toBeCloseTo(365 / 365.25, 12);
    // Before the harvest reference the age is negative (the chart clamps it at 0).
    expect(seedAgeYears('2025-09-14', '2025-09-13')).toBeCloseTo(-1 / 365.25, 12);
  });
});

describe('the coming sowing date', () => {
  it('when the bank has a last frost date, then it is eight weeks before the next one still ahead', () => {
    // 24 May 2027 − 56 days = 29 Mar 2027 (calendar arithmetic: 24 + 30 + 2 days back).
    expect(defaultSowingDate('05-24', '2026-12-01')).toBe('2027-03-29');
    // Before this spring's sowing day, this spring counts: 24 May 2026 − 56 days = 29 Mar 2026.
    expect(defaultSowingDate('05-24', '2026-02-10')).toBe('2026-03-29');
    // Past it (30 Mar), the next spring: 29 Mar 2027.
    expect(defaultSowingDate('05-24', '2026-03-30')).toBe('2027-03-29');
  });

  it('when the bank’s frost date is 29 February, then a common year counts from 28 February', () => {
    // 28 Feb 2027 − 56 days = 3 Jan 2027 (28 days back to 31 Jan, 28 more to 3 Jan; calendar).
    expect(defaultSowingDate('02-29', '2026-06-01')).toBe('2027-01-03');
    // 2028 is a leap year: 29 Feb 2028 − 56 days = 4 Jan 2028 (29 back to 31 Jan, 27 more).
    expect(defaultSowingDate('02-29', '2027-06-01')).toBe('2028-01-04');
  });

  it('when the bank has no frost date, then it is 90 days ahead', () => {
    // 1 Dec 2026 + 90 days = 1 Mar 2027 (30 days to 31 Dec, 31 to 31 Jan, 28 to 28 Feb, 1 more).
    expect(defaultSowingDate(null, '2026-12-01')).toBe('2027-03-01');
  });
});
