import { describe, expect, it } from 'vitest';
import { germinationTiming } from '../../../server/stats';

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

  it('when every seed comes up on one day, then synchrony is 1, uncertainty 0 and variance 0', () => {
    // Z = C(20,2)/C(20,2) = 1; U = −1·log₂1 = 0; variance 0 (Ranal & Santana 2006 formulas, computed).
    // T50 = 2 + (10 − 0)(3 − 2)/(20 − 0) = 2.5 and 2 + 10.5/20 = 2.525 (Coolbear et al. 1984 formula, computed).
    const t = germinationTiming([
      { day: 2, cumulative: 0 },
      { day: 3, cumulative: 20 },
    ]);
    expect(t.synchrony).toBe(1);
    expect(t.uncertaintyBits).toBe(0);
    expect(t.variance).toBe(0);
    expect(t.meanDays).toBe(3);
    expect(t.t50Days).toBeCloseTo(2.5, 12);
    expect(t.t50DaysCoolbear).toBeCloseTo(2.525, 12);
    expect(t.speedIndex).toBeCloseTo(20 / 3, 12); // Σ nᵢ/tᵢ = 20/3 (computed)
  });

  it('when the first check is already past half, then T50 interpolates from sowing (count 0 on day 0)', () => {
    // Hilum's documented convention; T50 = 0 + (5 − 0)(4 − 0)/(10 − 0) = 2 (formula in REFERENCES.md, computed).
    const t = germinationTiming([{ day: 4, cumulative: 10 }]);
    expect(t.t50Days).toBeCloseTo(2, 12);
    expect(t.t50DaysCoolbear).toBeCloseTo(2.2, 12); // (5.5)(4)/10 = 2.2 (computed)
  });

  it('when a single seed germinated, then variance and synchrony are undefined (null)', () => {
    // Both divide by N − 1 or C(N, 2), which vanish at N = 1 (Ranal & Santana 2006 formulas).
    const t = germinationTiming([
      { day: 3, cumulative: 0 },
      { day: 5, cumulative: 1 },
    ]);
    expect(t.variance).toBeNull();
    expect(t.synchrony).toBeNull();
    expect(t.meanDays).toBe(5);
    expect(t.uncertaintyBits).toBe(0);
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
