import { describe, expect, it } from 'vitest';
import {
  DAY_MS,
  addDays,
  addYears,
  dateInYear,
  dayIn,
  daysBetween,
  frostDateIn,
  isLeapYear,
  weekdayOf,
} from '#shared/dates';

/**
 * A second, independent count of days: the Julian Day Number of a Gregorian date by the integer
 * formula of Fliegel & Van Flandern (1968, Communications of the ACM 11(10):657), no Date object.
 */
function julianDayNumber(date: string): number {
  const [y, m, d] = date.split('-').map(Number) as [number, number, number];
  const a = Math.trunc((m - 14) / 12);
  return (
    Math.trunc((1461 * (y + 4800 + a)) / 4) +
    Math.trunc((367 * (m - 2 - 12 * a)) / 12) -
    Math.trunc((3 * Math.trunc((y + 4900 + a) / 100)) / 4) +
    d -
    32075
  );
}

/** A seeded generator (mulberry32), so the sampled dates are the same on every run. */
function generator(seed: number) {
  let t = seed >>> 0;
  return () => {
    t = (t + 0x6d2b79f5) >>> 0;
    let r = Math.imul(t ^ (t >>> 15), 1 | t);
    r ^= r + Math.imul(r ^ (r >>> 7), 61 | r);
    return ((r ^ (r >>> 14)) >>> 0) / 4294967296;
  };
}

describe('the second count of days (checked first, so it can check the module)', () => {
  it('when the formula is given the J2000 epoch and the Unix epoch, then it gives their known day numbers', () => {
    // J2000.0 is JD 2451545.0, noon of 1 January 2000 (IAU 1976 astronomical constants; from memory).
    expect(julianDayNumber('2000-01-01')).toBe(2451545);
    // The Unix epoch 1970-01-01 is JD 2440587.5 at midnight, so day number 2440588 (POSIX time; from memory).
    expect(julianDayNumber('1970-01-01')).toBe(2440588);
    // The two agree with each other: 2000-01-01T00:00:00Z is Unix time 946684800 s = 10957 days (from memory).
    expect(julianDayNumber('2000-01-01') - julianDayNumber('1970-01-01')).toBe(946_684_800 / 86_400);
  });
});

describe('days between two calendar days', () => {
  it('when the Unix epoch and the year 2000 are compared, then 10957 days lie between', () => {
    // 946684800 s of Unix time / 86400 s a day (POSIX; from memory), and the day-number formula above.
    expect(daysBetween('1970-01-01', '2000-01-01')).toBe(10_957);
    expect(daysBetween('1970-01-01', '2000-01-01')).toBe(
      julianDayNumber('2000-01-01') - julianDayNumber('1970-01-01'),
    );
  });

  it('when 500 seeded pairs of days from 1900 to 2199 are counted, then every count matches the day-number formula', () => {
    const rnd = generator(20260320);
    const start = julianDayNumber('1900-01-01');
    const span = julianDayNumber('2199-12-31') - start;
    for (let i = 0; i < 500; i++) {
      const from = addDays('1900-01-01', Math.floor(rnd() * span));
      const to = addDays('1900-01-01', Math.floor(rnd() * span));
      expect(daysBetween(from, to), `${from} → ${to}`).toBe(julianDayNumber(to) - julianDayNumber(from));
    }
  });

  it('when the day is the last of the Gregorian months of a common and a leap year, then the month lengths are the calendar’s', () => {
    // Thirty days hath September, April, June and November; February 28, 29 in a leap year (calendar).
    const common = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];
    const leap = [31, 29, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];
    const lengths = (year: number) =>
      Array.from({ length: 12 }, (_, m) => {
        const first = `${year}-${String(m + 1).padStart(2, '0')}-01`;
        const next = m === 11 ? `${year + 1}-01-01` : `${year}-${String(m + 2).padStart(2, '0')}-01`;
        return daysBetween(first, next);
      });
    expect(lengths(2027)).toEqual(common);
    expect(lengths(2028)).toEqual(leap);
  });

  it('when `to` comes first, then the count is negative', () => {
    expect(daysBetween('2026-03-20', '2026-03-13')).toBe(-7);
  });
});

describe('adding days', () => {
  it('when days are added across a month, a year and 29 February, then the day is the calendar’s', () => {
    // By hand: 28 Feb 2028 + 1 is 29 Feb (2028 is a leap year); 28 Feb 2027 + 1 is 1 Mar.
    expect(addDays('2028-02-28', 1)).toBe('2028-02-29');
    expect(addDays('2027-02-28', 1)).toBe('2027-03-01');
    expect(addDays('2026-12-31', 1)).toBe('2027-01-01');
    expect(addDays('2027-01-01', -1)).toBe('2026-12-31');
  });

  it('when a daylight-saving change falls in the span, then no day is lost or doubled', () => {
    // Clocks in the EU went forward on 31 March 2024 and back on 27 October 2024 (EU Directive
    // 2000/84/EC: last Sunday of March and of October); calendar days are still one apart.
    expect(addDays('2024-03-30', 1)).toBe('2024-03-31');
    expect(addDays('2024-03-31', 1)).toBe('2024-04-01');
    expect(addDays('2024-10-26', 2)).toBe('2024-10-28');
  });

  it('when seeded offsets are added, then the day number moves by the same offset', () => {
    const rnd = generator(7);
    for (let i = 0; i < 200; i++) {
      const offset = Math.floor(rnd() * 40_000) - 20_000;
      expect(julianDayNumber(addDays('2026-03-20', offset))).toBe(julianDayNumber('2026-03-20') + offset);
    }
  });

  it('when a day is defined in milliseconds, then it is 24 hours', () => {
    expect(DAY_MS).toBe(24 * 60 * 60 * 1000);
  });
});

describe('leap years and 29 February', () => {
  it.each([
    [2024, true],
    [2028, true],
    [2000, true], // divisible by 400
    [2027, false],
    [1900, false], // a century not divisible by 400
    [2100, false],
  ])(
    'when the year is %i, then leap is %s (Gregorian rule, papal bull Inter gravissimas 1582)',
    (year, leap) => {
      expect(isLeapYear(year)).toBe(leap);
      // And by counting: a leap year has 366 days.
      expect(daysBetween(`${year}-01-01`, `${year + 1}-01-01`)).toBe(leap ? 366 : 365);
    },
  );

  it('when a frost date is 29 February, then a common year takes 28 February and a leap year keeps it (Hilum’s rule)', () => {
    expect(frostDateIn(2027, '02-29')).toBe('2027-02-28');
    expect(frostDateIn(2028, '02-29')).toBe('2028-02-29');
    expect(frostDateIn(2100, '02-29')).toBe('2100-02-28');
    expect(frostDateIn(2000, '02-29')).toBe('2000-02-29');
    expect(frostDateIn(2027, '05-24')).toBe('2027-05-24');
  });

  it('when a date is moved a year on, then 29 February lands on 28 February and other days keep their place', () => {
    expect(addYears('2028-02-29', 1)).toBe('2029-02-28');
    expect(addYears('2027-03-29', 1)).toBe('2028-03-29');
    expect(dateInYear(2031, '12-31')).toBe('2031-12-31');
  });
});

describe('the weekday of a calendar day', () => {
  it('when known days are asked, then their weekdays are the calendar’s', () => {
    // 1 January 1970 was a Thursday and 1 January 2000 a Saturday (calendar; from memory), checked
    // against the day number: (JDN + 1) mod 7 is 0 on a Sunday (Meeus, Astronomical Algorithms, ch. 7).
    expect(weekdayOf('1970-01-01')).toBe(4);
    expect(weekdayOf('2000-01-01')).toBe(6);
    const rnd = generator(11);
    for (let i = 0; i < 100; i++) {
      const day = addDays('1900-01-01', Math.floor(rnd() * 100_000));
      expect(weekdayOf(day)).toBe((julianDayNumber(day) + 1) % 7);
    }
  });
});

describe('today in a time zone', () => {
  const offsetOf = (timeZone: string, at: Date) =>
    new Intl.DateTimeFormat('en-US', { timeZone, timeZoneName: 'longOffset' })
      .formatToParts(at)
      .find((p) => p.type === 'timeZoneName')?.value;

  it('when it is 10:00 UTC, then a bank at UTC+14 is on the next day and one at UTC−11 on the day before', () => {
    const at = new Date('2026-03-20T10:00:00Z');
    // Pacific/Kiritimati keeps UTC+14 and Pacific/Pago_Pago UTC−11 all year (IANA tz database; from
    // memory), and the zone data Node ships says the same:
    expect(offsetOf('Pacific/Kiritimati', at)).toBe('GMT+14:00');
    expect(offsetOf('Pacific/Pago_Pago', at)).toBe('GMT-11:00');
    // 10:00 + 14 h = 24:00, midnight starting 21 March; 10:00 − 11 h = 23:00 on 19 March.
    expect(dayIn('Pacific/Kiritimati', at)).toBe('2026-03-21');
    expect(dayIn('Pacific/Pago_Pago', at)).toBe('2026-03-19');
    expect(dayIn('UTC', at)).toBe('2026-03-20');
  });

  it('when a zone changes its clocks, then the day still turns at local midnight', () => {
    // New York went from EST (UTC−5) to EDT (UTC−4) on 10 March 2024 (US Energy Policy Act of 2005:
    // second Sunday in March). 04:59 UTC is 23:59 EST on the 9th; 05:00 UTC is midnight of the 10th.
    expect(dayIn('America/New_York', new Date('2024-03-10T04:59:00Z'))).toBe('2024-03-09');
    expect(dayIn('America/New_York', new Date('2024-03-10T05:00:00Z'))).toBe('2024-03-10');
    // And on 11 March, EDT: 03:59 UTC is 23:59 on the 10th; 04:00 UTC is midnight of the 11th.
    expect(dayIn('America/New_York', new Date('2024-03-11T03:59:00Z'))).toBe('2024-03-10');
    expect(dayIn('America/New_York', new Date('2024-03-11T04:00:00Z'))).toBe('2024-03-11');
  });
});
