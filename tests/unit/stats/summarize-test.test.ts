import { describe, expect, it } from 'vitest';
import {
  clopperPearsonInterval,
  germinationTiming,
  homogeneityChiSquare,
  maxToleratedRange,
  summarizeTest,
  wilsonInterval,
} from '../../../server/stats';
import type { TestTray } from '../../../server/stats';

/** Turns new germinants per day (days 1…) into cumulative checks. */
function tray(id: string, seedsSown: number, newPerDay: number[]): TestTray {
  let total = 0;
  return { id, seedsSown, checks: newPerDay.map((n, i) => ({ day: i + 1, cumulative: (total += n) })) };
}

// Four trays of 25 whose new germinants add up, day by day, to REFERENCES.md's worked example
// (0, 10, 25, 25, 15, 5 on days 1–6; 80 of 100 seeds). The split between trays is invented.
const WORKED_TRAYS = [
  tray('a', 25, [0, 3, 6, 6, 4, 1]),
  tray('b', 25, [0, 2, 7, 6, 4, 1]),
  tray('c', 25, [0, 3, 6, 7, 3, 1]),
  tray('d', 25, [0, 2, 6, 6, 4, 2]),
];

/** Four trays of 100 with the given final counts, all counted on day 7 and day 14. */
function finalCounts(...finals: number[]): TestTray[] {
  return finals.map((f, i) => ({
    id: `t${String(i)}`,
    seedsSown: 100,
    checks: [
      { day: 7, cumulative: Math.floor(f / 2) },
      { day: 14, cumulative: f },
    ],
  }));
}

describe('summarizeTest', () => {
  it('when the trays pool to the worked example, then the timing measures reproduce it', () => {
    const r = summarizeTest(WORKED_TRAYS);
    expect(r.sown).toBe(100);
    expect(r.germinated).toBe(80);
    expect(r.percent).toBe(80);
    expect(r.meanDays).toBeCloseTo(3.75, 12); // Ranal & Santana 2006 formulas; worked example computed
    expect(r.variance).toBeCloseTo(1.202532, 6); // same
    expect(r.speedIndex).toBeCloseTo(23.416667, 6); // same
    expect(r.uncertaintyBits).toBeCloseTo(2.126614, 6); // same
    expect(r.synchrony).toBeCloseTo(0.240506, 6); // same
    expect(r.t50Days).toBeCloseTo(3.2, 12); // Farooq et al. 2005 T50; worked example computed
    expect(r.t50DaysCoolbear).toBeCloseTo(3.22, 12); // Coolbear et al. 1984 T50; worked example computed
  });

  it('when four trays of 100 are counted, then percent, interval and tolerance follow the references', () => {
    const r = summarizeTest(finalCounts(95, 90, 88, 87));
    expect(r.percent).toBe(90); // 360/400
    expect(r.percentRounded).toBe(90);
    const wilson = wilsonInterval(360, 400); // cross-check with the Wilson interval (tested against Newcombe 1998)
    expect(r.interval).toEqual({
      low: 100 * wilson.low,
      high: 100 * wilson.high,
      method: 'wilson',
      confidence: 0.95,
    });
    expect(r.trayPercents.map((t) => t.percent)).toEqual([95, 90, 88, 87]);
    expect(r.agreement).toEqual({ maxRange: 12, observedRange: 8, ok: true }); // 90% → 12 (7 CFR 201.55)
    expect(r.homogeneity).toEqual(
      homogeneityChiSquare(
        finalCounts(95, 90, 88, 87).map((t) => ({ germinated: t.checks[1]?.cumulative ?? 0, sown: 100 })),
      ),
    );
  });

  it('when the replicates spread wider than the table allows, then agreement is not ok', () => {
    // Mean (97 + 92 + 88 + 83)/4 = 90 → tolerated 12 (7 CFR 201.55); observed 97 − 83 = 14.
    const r = summarizeTest(finalCounts(97, 92, 88, 83));
    expect(r.agreement).toEqual({ maxRange: 12, observedRange: 14, ok: false });
  });

  it('when the pooled percentage ends in one half, then it is rounded up to the whole percent', () => {
    // ISTA Rules ch. 5: the result is rounded to the nearest whole number; halves up (common practice).
    const r = summarizeTest(finalCounts(84, 85, 85, 84)); // 338/400 = 84.5
    expect(r.percent).toBe(84.5);
    expect(r.percentRounded).toBe(85);
    const low = summarizeTest(finalCounts(84, 84, 85, 84)); // 337/400 = 84.25
    expect(low.percentRounded).toBe(84);
  });

  it('when asked for the exact interval, then it uses Clopper–Pearson in percent', () => {
    const r = summarizeTest(finalCounts(95, 90, 88, 87), {
      intervalMethod: 'clopper-pearson',
      confidence: 0.99,
    });
    const exact = clopperPearsonInterval(360, 400, 0.99); // tested against Newcombe 1998 and binomial tails
    expect(r.interval).toEqual({
      low: 100 * exact.low,
      high: 100 * exact.high,
      method: 'clopper-pearson',
      confidence: 0.99,
    });
  });

  it('when trays are checked on different days, then counts are carried forward before pooling', () => {
    const trays: TestTray[] = [
      {
        id: 'x',
        seedsSown: 50,
        checks: [
          { day: 3, cumulative: 10 },
          { day: 5, cumulative: 30 },
          { day: 9, cumulative: 40 },
        ],
      },
      {
        id: 'y',
        seedsSown: 50,
        checks: [
          { day: 4, cumulative: 20 },
          { day: 5, cumulative: 25 },
          { day: 8, cumulative: 45 },
        ],
      },
    ];
    // Pooled by hand: day 3: 10 + 0; day 4: 10 + 20; day 5: 30 + 25; day 8: 30 + 45; day 9: 40 + 45.
    const pooled = [
      { day: 3, cumulative: 10 },
      { day: 4, cumulative: 30 },
      { day: 5, cumulative: 55 },
      { day: 8, cumulative: 75 },
      { day: 9, cumulative: 85 },
    ];
    const r = summarizeTest(trays);
    const expected = germinationTiming(pooled); // tested against the worked example above
    expect(r.meanDays).toBe(expected.meanDays);
    expect(r.t50Days).toBe(expected.t50Days);
    expect(r.speedIndex).toBe(expected.speedIndex);
    expect(r.germinated).toBe(85);
    // Two replicates of 50 are not in the table: computed range for the rounded mean 85.
    expect(r.agreement.maxRange).toBe(maxToleratedRange(85, 2, 50));
    expect(r.agreement.observedRange).toBe(10);
  });

  it('when a tray has not been counted yet, then it is left out of the figures', () => {
    const trays = [...finalCounts(90, 80), { id: 'later', seedsSown: 100, checks: [] }];
    const r = summarizeTest(trays);
    expect(r.traysTotal).toBe(3);
    expect(r.traysCounted).toBe(2);
    expect(r.sown).toBe(200);
    expect(r.percent).toBe(85);
    expect(r.trayPercents[2]).toEqual({ id: 'later', seedsSown: 100, germinated: null, percent: null });
    expect(r.agreement.maxRange).toBe(11); // two replicates of 100 at 85% → 11 (7 CFR 201.55)
  });

  it('when no tray has been counted, then every figure is null', () => {
    const r = summarizeTest([{ id: 'a', seedsSown: 100, checks: [] }]);
    expect(r.sown).toBeNull();
    expect(r.percent).toBeNull();
    expect(r.percentRounded).toBeNull();
    expect(r.interval).toBeNull();
    expect(r.meanDays).toBeNull();
    expect(r.t50Days).toBeNull();
    expect(r.speedIndex).toBeNull();
    expect(r.agreement).toEqual({ maxRange: null, observedRange: null, ok: null });
    expect(r.homogeneity).toBeNull();
    expect(summarizeTest([]).percent).toBeNull();
  });

  it('when only one tray is counted, then agreement and homogeneity are not computed', () => {
    const r = summarizeTest(finalCounts(90));
    expect(r.percent).toBe(90);
    expect(r.agreement.ok).toBeNull();
    expect(r.homogeneity).toBeNull();
  });

  it('when a count exceeds the seeds sown or trays repeat an id, then it throws a RangeError', () => {
    expect(() => summarizeTest([{ id: 'a', seedsSown: 10, checks: [{ day: 3, cumulative: 11 }] }])).toThrow(
      RangeError,
    );
    expect(() => summarizeTest([...finalCounts(90), ...finalCounts(80)])).toThrow(RangeError);
    expect(() => summarizeTest([{ id: 'a', seedsSown: 0, checks: [] }])).toThrow(RangeError);
    expect(() => summarizeTest(finalCounts(90), { confidence: 1.5 })).toThrow(RangeError);
  });
});
