import { describe, expect, it } from 'vitest';
import { germinationTiming, timingNote } from '#server/stats/index';

// REFERENCES.md worked example: 100 seeds, new germinants on days 1–6 = 0, 10, 25, 25, 15, 5,
// given here as cumulative counts. Formulas: Ranal & Santana 2006 (Revista Brasil. Bot. 29:1–11);
// T50 after Coolbear et al. 1984 and Farooq et al. 2005; worked example computed.
const WORKED = [
  { day: 1, cumulative: 0 },
  { day: 2, cumulative: 10 },
  { day: 3, cumulative: 35 },
  { day: 4, cumulative: 60 },
  { day: 5, cumulative: 75 },
  { day: 6, cumulative: 80 },
];

describe('germinationTiming', () => {
  it('when given the worked example, then every measure reproduces it', () => {
    const t = germinationTiming(WORKED);
    expect(timingNote(WORKED)).toBeNull(); // seedlings on five check days: every figure is supported
    expect(t.germinated).toBe(80); // N = 80 (worked example)
    expect(t.meanDays).toBeCloseTo(3.75, 12); // MGT 3.75 d (Ranal & Santana 2006 formulas; worked example computed)
    expect(t.rate).toBeCloseTo(0.26667, 5); // rate 0.26667 /d (same)
    expect(t.variance).toBeCloseTo(1.202532, 6); // variance 1.202532 d² (same)
    expect(t.coefficientOfVelocity).toBeCloseTo(26.6667, 4); // CV 26.6667 (same)
    expect(t.uncertaintyBits).toBeCloseTo(2.126614, 6); // U 2.126614 bits (same)
    expect(t.synchrony).toBeCloseTo(0.240506, 6); // Z 0.240506 (same)
    expect(t.speedIndex).toBeCloseTo(23.416667, 6); // speed index 23.416667 (same)
    expect(t.t50Days).toBeCloseTo(3.2, 12); // T50 at N/2 = 3.20 d (Farooq et al. 2005; worked example computed)
    expect(t.t50DaysCoolbear).toBeCloseTo(3.22, 12); // T50 at (N+1)/2 = 3.22 d (Coolbear et al. 1984; computed)
  });

  it('when the checks arrive out of order, then the result is the same', () => {
    // Order-independence of the formulas (Ranal & Santana 2006): they depend on (tᵢ, nᵢ) pairs only.
    expect(germinationTiming([...WORKED].reverse())).toEqual(germinationTiming(WORKED));
  });

  it('when the worked example starts at the first seedlings (no zero count), then every measure is unchanged', () => {
    // Seedlings were found on five check days, so the times are pinned down by the counts
    // themselves; a zero count adds nothing to any formula (Ranal & Santana 2006; worked example computed).
    const t = germinationTiming(WORKED.slice(1));
    expect(t).toEqual(germinationTiming(WORKED));
    expect(t.t50Days).toBeCloseTo(3.2, 12); // between the real counts of day 3 (35) and day 4 (60)
    expect(timingNote(WORKED.slice(1))).toBeNull();
  });

  it('when there is only a final count, then no timing figure is stated and the note says why', () => {
    // Everything came up some time between sowing and day 14: MGT = 14, T50 = 7, U = 0, Z = 1 by
    // the formulas would describe the count schedule, not the seeds (Hilum's rule, documented in
    // germination-timing.ts; formulas Ranal & Santana 2006, T50 Coolbear et al. 1984).
    const final = [{ day: 14, cumulative: 80 }];
    expect(germinationTiming(final)).toEqual({
      germinated: 80,
      meanDays: null,
      variance: null,
      rate: null,
      coefficientOfVelocity: null,
      t50Days: null,
      t50DaysCoolbear: null,
      speedIndex: null,
      uncertaintyBits: null,
      synchrony: null,
    });
    expect(timingNote(final)).toMatch(/first seen at the count on day 14.*not known/);
  });

  it('when everything is up at the first check, after an earlier check on sowing day only, then nothing is supported either', () => {
    // A count of 0 on day 0 is no evidence: nothing germinates on the day of sowing.
    const checks = [
      { day: 0, cumulative: 0 },
      { day: 4, cumulative: 10 },
      { day: 7, cumulative: 10 },
    ];
    const t = germinationTiming(checks);
    expect([t.meanDays, t.t50Days, t.t50DaysCoolbear, t.speedIndex, t.uncertaintyBits, t.synchrony]).toEqual([
      null,
      null,
      null,
      null,
      null,
      null,
    ]);
    expect(timingNote(checks)).toContain('day 4');
  });

  it('when every seedling came up between a zero count and the next, then the times stand but the spread measures are null', () => {
    // Known interval (day 2, day 3]: MGT = 3 (Ranal & Santana 2006 formula); T50 = 2 + (10 − 0)(3 − 2)/(20 − 0)
    // = 2.5 and 2 + 10.5/20 = 2.525 (Coolbear et al. 1984 formula, computed). U = 0 and Z = 1 would only
    // say that one check found them all: null.
    const checks = [
      { day: 2, cumulative: 0 },
      { day: 3, cumulative: 20 },
    ];
    const t = germinationTiming(checks);
    expect(t.meanDays).toBe(3);
    expect(t.rate).toBeCloseTo(1 / 3, 12);
    expect(t.t50Days).toBeCloseTo(2.5, 12);
    expect(t.t50DaysCoolbear).toBeCloseTo(2.525, 12);
    expect(t.speedIndex).toBeCloseTo(20 / 3, 12); // Σ nᵢ/tᵢ = 20/3 (computed)
    expect(t.synchrony).toBeNull();
    expect(t.uncertaintyBits).toBeNull();
    expect(t.variance).toBeNull();
    expect(timingNote(checks)).toMatch(/between the counts on day 2 and day 3.*how evenly/);
  });

  it('when half were already up at the first count and no zero count came before it, then only T50 is null', () => {
    // Days 7 and 14 found 80 and 5 more: MGT = (80·7 + 5·14)/85 = 630/85 (Ranal & Santana 2006, computed).
    // T50 targets 42.5 and 43 lie inside the first count, which would interpolate from sowing day.
    const checks = [
      { day: 7, cumulative: 80 },
      { day: 14, cumulative: 85 },
    ];
    const t = germinationTiming(checks);
    expect(t.meanDays).toBeCloseTo(630 / 85, 12);
    expect(t.t50Days).toBeNull();
    expect(t.t50DaysCoolbear).toBeNull();
    // U = −(80/85·log₂(80/85) + 5/85·log₂(5/85)) (Ranal & Santana 2006 formula, computed).
    expect(t.uncertaintyBits).toBeCloseTo(
      -((80 / 85) * Math.log2(80 / 85) + (5 / 85) * Math.log2(5 / 85)),
      12,
    );
    expect(timingNote(checks)).toMatch(/Half of the seedlings were already up.*day 7/);
  });

  it('when a single seed germinated after a zero count, then variance, synchrony and uncertainty are null', () => {
    // Variance and synchrony divide by N − 1 or C(N, 2), which vanish at N = 1 (Ranal & Santana 2006 formulas);
    // one check day with seedlings says nothing of spread (Hilum's rule).
    const t = germinationTiming([
      { day: 3, cumulative: 0 },
      { day: 5, cumulative: 1 },
    ]);
    expect(t.variance).toBeNull();
    expect(t.synchrony).toBeNull();
    expect(t.meanDays).toBe(5);
    expect(t.uncertaintyBits).toBeNull();
  });

  it('when nothing germinated, then the time measures are null and the speed index is 0', () => {
    // MGT and the rest divide by N = 0; the speed index is an empty sum (Ranal & Santana 2006 formulas).
    const t = germinationTiming([
      { day: 3, cumulative: 0 },
      { day: 7, cumulative: 0 },
    ]);
    expect(t).toEqual({
      germinated: 0,
      meanDays: null,
      variance: null,
      rate: null,
      coefficientOfVelocity: null,
      t50Days: null,
      t50DaysCoolbear: null,
      speedIndex: 0,
      uncertaintyBits: null,
      synchrony: null,
    });
    expect(germinationTiming([]).germinated).toBe(0);
    expect(timingNote([{ day: 3, cumulative: 0 }])).toBe('No seedlings yet, so there is nothing to time.');
    expect(timingNote([])).toBeNull();
  });

  it('when counts fall, repeat a day or are negative, then it throws a RangeError', () => {
    expect(() =>
      germinationTiming([
        { day: 2, cumulative: 5 },
        { day: 3, cumulative: 4 },
      ]),
    ).toThrow(RangeError);
    expect(() =>
      germinationTiming([
        { day: 2, cumulative: 5 },
        { day: 2, cumulative: 6 },
      ]),
    ).toThrow(RangeError);
    expect(() => germinationTiming([{ day: -1, cumulative: 0 }])).toThrow(RangeError);
    expect(() => germinationTiming([{ day: 2, cumulative: -3 }])).toThrow(RangeError);
    expect(() => germinationTiming([{ day: 0, cumulative: 3 }])).toThrow(RangeError);
    expect(() => germinationTiming([{ day: 2, cumulative: 1.5 }])).toThrow(RangeError);
  });
});
