import { describe, expect, it } from 'vitest';
import {
  clopperPearsonInterval,
  germinationFromUncertainSown,
  germinationTiming,
  homogeneityChiSquare,
  maxToleratedRange,
  summarizeTest,
  wilsonInterval,
} from '#server/stats/index';
import type { AssayTray } from '#server/stats/index';

/** Turns new germinants per day (days 1…) into cumulative checks. */
function tray(id: string, seedsSown: number, newPerDay: number[]): AssayTray {
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

/** Trays of 100 with the given final counts and no other count (day 14 only). */
function finalOnly(...finals: number[]): AssayTray[] {
  return finals.map((f, i) => ({
    id: `f${String(i)}`,
    seedsSown: 100,
    checks: [{ day: 14, cumulative: f }],
  }));
}

/** Four trays of 100 with the given final counts, all counted on day 7 and day 14. */
function finalCounts(...finals: number[]): AssayTray[] {
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
    // Trays of one size: the tolerance table; 90% → 12 (7 CFR 201.55 as printed).
    expect(r.agreement).toEqual({
      method: 'tolerance-table',
      maxRange: 12,
      observedRange: 8,
      ok: true,
      pValue: null,
    });
    expect(r.homogeneity).toEqual(
      homogeneityChiSquare(
        finalCounts(95, 90, 88, 87).map((t) => ({ germinated: t.checks[1]?.cumulative ?? 0, sown: 100 })),
      ),
    );
  });

  it('when the replicates spread wider than the table allows, then agreement is not ok', () => {
    // Mean (97 + 92 + 88 + 83)/4 = 90 → tolerated 12 (7 CFR 201.55); observed 97 − 83 = 14.
    const r = summarizeTest(finalCounts(97, 92, 88, 83));
    expect(r.agreement).toEqual({
      method: 'tolerance-table',
      maxRange: 12,
      observedRange: 14,
      ok: false,
      pValue: null,
    });
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
    const trays: AssayTray[] = [
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
    expect(r.trayPercents[2]).toEqual({
      id: 'later',
      seedsSown: 100,
      sownMean: 100,
      sownSd: 0,
      score: null,
      state: 'not-counted',
      setAsideReason: null,
      germinated: null,
      percent: null,
      abnormal: null,
      ungerminated: null,
      fresh: null,
      dead: null,
      hard: null,
    });
    expect(r.trayPercents[0]?.state).toBe('counted');
    expect(r.agreement.maxRange).toBe(11); // two replicates of 100 at 85% → 11 (7 CFR 201.55 as printed)
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
    expect(r.agreement).toEqual({
      method: 'tolerance-table',
      maxRange: null,
      observedRange: null,
      ok: null,
      pValue: null,
    });
    expect(r.homogeneity).toBeNull();
    expect(r.timingNote).toBeNull();
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
    expect(() => summarizeTest([{ id: 'a', seedsSown: 10, checks: [], abnormal: -1 }])).toThrow(RangeError);
    expect(() => summarizeTest([{ id: 'a', seedsSown: 10, checks: [], fresh: 1.5 }])).toThrow(RangeError);
  });

  it('when a tray is set aside, then it is left out of every figure and shown as set aside', () => {
    // The 4-tray example of issue 12: trays of 100 at 80 and 90, a third set aside after counting 10.
    const trays: AssayTray[] = [
      ...finalCounts(80, 90),
      { id: 'spilled', seedsSown: 100, checks: [{ day: 7, cumulative: 10 }], setAsideReason: 'Spilled' },
      { id: 'later', seedsSown: 100, checks: [] },
    ];
    const r = summarizeTest(trays);
    const without = summarizeTest([...finalCounts(80, 90), { id: 'later', seedsSown: 100, checks: [] }]);
    expect(r.percent).toBe(85); // 170/200: the set-aside tray's 10 enter nothing
    expect(r.traysTotal).toBe(4);
    expect(r.traysCounted).toBe(2);
    expect(r.traysSetAside).toBe(1);
    expect(r.trayPercents.map((t) => t.state)).toEqual(['counted', 'counted', 'set-aside', 'not-counted']);
    expect(r.trayPercents[2]).toMatchObject({ setAsideReason: 'Spilled', germinated: null, percent: null });
    const { trayPercents, traysTotal, traysSetAside, ...figures } = r;
    const { trayPercents: _t, traysTotal: _n, traysSetAside: _s, ...figuresWithout } = without;
    expect(figures).toEqual(figuresWithout);
    expect(trayPercents).toHaveLength(traysTotal);
    expect(traysSetAside).toBe(1);
  });

  it('when every tray has its finish figures, then they are pooled; when one lacks a figure, that figure is null', () => {
    const finished: AssayTray[] = [
      { ...tray('a', 50, [0, 20, 20]), abnormal: 3, ungerminated: 7, fresh: 4, dead: 3, hard: 0 },
      { ...tray('b', 50, [0, 25, 15]), abnormal: 2, ungerminated: 8, fresh: 5, dead: 3, hard: null },
      { ...tray('c', 50, [0, 0, 5]), setAsideReason: 'Dried out', abnormal: 40, ungerminated: 5 },
    ];
    const r = summarizeTest(finished);
    expect(r.abnormal).toBe(5);
    expect(r.ungerminated).toBe(15);
    expect(r.fresh).toBe(9);
    expect(r.dead).toBe(6);
    expect(r.hard).toBeNull(); // tray b has no hard-seed figure
    expect(r.trayPercents[1]).toMatchObject({ abnormal: 2, ungerminated: 8, fresh: 5, dead: 3, hard: null });
    const running = summarizeTest(finalCounts(80, 90));
    expect([running.abnormal, running.ungerminated, running.fresh, running.dead, running.hard]).toEqual([
      null,
      null,
      null,
      null,
      null,
    ]);
  });

  it('when trays differ in size, then agreement is judged by the chi-square test, not the table', () => {
    const r = summarizeTest([
      { id: 'small', seedsSown: 10, checks: [{ day: 7, cumulative: 9 }] },
      { id: 'large', seedsSown: 190, checks: [{ day: 7, cumulative: 171 }] },
    ]);
    expect(r.agreement).toEqual({
      method: 'chi-square',
      maxRange: null,
      observedRange: 0,
      ok: true,
      pValue: 1,
    });
    // The method follows the trays that can enter the figures, even before they are all counted.
    const partly = summarizeTest([
      { id: 'small', seedsSown: 10, checks: [{ day: 7, cumulative: 9 }] },
      { id: 'large', seedsSown: 190, checks: [] },
    ]);
    expect(partly.agreement.method).toBe('chi-square');
    expect(partly.agreement.ok).toBeNull();
  });

  it('when every tray has only a final count, then the timing figures are null and the note says why', () => {
    const r = summarizeTest(finalOnly(95, 90, 88, 87));
    expect(r.percent).toBe(90);
    expect([r.meanDays, r.t50Days, r.t50DaysCoolbear, r.uncertaintyBits, r.synchrony, r.variance]).toEqual([
      null,
      null,
      null,
      null,
      null,
      null,
    ]);
    expect(r.timingNote).toMatch(/day 14/);
    expect(summarizeTest(WORKED_TRAYS).timingNote).toBeNull();
  });

  it('when a tray had not been checked yet on a day another counted none, then that day does not count as a zero count', () => {
    // Tray x counted 0 on day 5; tray y was first counted on day 9 with 40 (it may have had seedlings
    // on day 5). So the seedlings' days are not known: only day 9 found them.
    const r = summarizeTest([
      {
        id: 'x',
        seedsSown: 50,
        checks: [
          { day: 5, cumulative: 0 },
          { day: 9, cumulative: 0 },
        ],
      },
      { id: 'y', seedsSown: 50, checks: [{ day: 9, cumulative: 40 }] },
    ]);
    expect(r.meanDays).toBeNull();
    // When both trays were counted on day 5, the zero is real and the interval (5, 9] is known.
    const both = summarizeTest([
      {
        id: 'x',
        seedsSown: 50,
        checks: [
          { day: 5, cumulative: 0 },
          { day: 9, cumulative: 0 },
        ],
      },
      {
        id: 'y',
        seedsSown: 50,
        checks: [
          { day: 5, cumulative: 0 },
          { day: 9, cumulative: 40 },
        ],
      },
    ]);
    expect(both.meanDays).toBe(9);
    expect(both.t50Days).toBeCloseTo(7, 12); // 5 + (20 − 0)(9 − 5)/(40 − 0) (Coolbear et al. 1984 formula, computed)
  });

  it('when summarized, then the result is plain JSON: no undefined, NaN or infinity', () => {
    for (const trays of [
      finalOnly(95, 90),
      WORKED_TRAYS,
      [{ id: 'a', seedsSown: 10, checks: [] }],
      finalCounts(0, 0),
    ]) {
      const r = summarizeTest(trays);
      expect(JSON.parse(JSON.stringify(r))).toStrictEqual(r);
    }
  });
});

// Trays sown by weight or guess, and trays scored roughly. Expected intervals are those of
// germinationFromUncertainSown (checked by seeded simulation in uncertain-sown.test.ts, and equal to
// Wilson 1927 when counted), and Wilson's own for counted trays.
describe('summarizeTest with trays not counted in, or scored roughly', () => {
  it('when trays are sown by estimate, then their means and variances add and the interval is widened', () => {
    const r = summarizeTest([
      { id: 'w', seedsSown: 40, sownSd: 6, checks: [{ day: 7, cumulative: 25 }] },
      { id: 'g', seedsSown: 30, sownSd: 8, checks: [{ day: 7, cumulative: 15 }] },
    ]);
    const expected = germinationFromUncertainSown(40, { mean: 70, sd: Math.sqrt(36 + 64) });
    if (expected.kind !== 'estimate') throw new Error('expected an estimate');
    expect(r).toMatchObject({
      seedsSownEstimated: true,
      sown: 70,
      germinated: 40,
      seedlingsExceedSown: false,
    });
    expect(r.sownSd).toBeCloseTo(10, 12);
    expect(r.percent).toBeCloseTo(100 * expected.fraction, 12);
    expect(r.interval).toMatchObject({ method: 'widened-score' });
    expect(r.interval!.low).toBeCloseTo(100 * expected.interval.low, 12);
    expect(r.interval!.high).toBeCloseTo(100 * expected.interval.high, 12);
    const counted = wilsonInterval(40, 70);
    expect(r.interval!.high - r.interval!.low).toBeGreaterThan(100 * (counted.high - counted.low));
    // Agreement needs the seeds sown in each tray: not judged.
    expect(r.agreement.ok).toBeNull();
    expect(r.homogeneity).toBeNull();
    expect(r.trayPercents[0]).toMatchObject({ seedsSown: null, sownMean: 40, sownSd: 6, state: 'counted' });
  });

  it('when a counted tray is pooled with an estimated one, then only the estimate adds spread', () => {
    const r = summarizeTest([
      { id: 'c', seedsSown: 50, checks: [{ day: 7, cumulative: 30 }] },
      { id: 'w', seedsSown: 40, sownSd: 6, checks: [{ day: 7, cumulative: 20 }] },
    ]);
    const expected = germinationFromUncertainSown(50, { mean: 90, sd: 6 });
    if (expected.kind !== 'estimate') throw new Error('expected an estimate');
    expect(r.sownSd).toBe(6);
    expect(r.interval!.low).toBeCloseTo(100 * expected.interval.low, 12);
  });

  it('when more seedlings come up than the estimate makes plausible, then no percentage is given', () => {
    const r = summarizeTest([{ id: 'p', seedsSown: 20, sownSd: 5, checks: [{ day: 7, cumulative: 60 }] }]);
    expect(r).toMatchObject({ seedlingsExceedSown: true, percent: null, interval: null, germinated: 60 });
  });

  it('when a tray is scored roughly, then it enters no percentage and the others keep theirs', () => {
    const only = summarizeTest([{ id: 's', seedsSown: 30, sownSd: 8, checks: [], score: 'few' }]);
    expect(only).toMatchObject({ percent: null, sown: null, interval: null, traysCounted: 0 });
    expect(only.trayPercents[0]).toMatchObject({ state: 'scored', score: 'few', percent: null });
    const mixed = summarizeTest([
      { id: 'c', seedsSown: 25, checks: [{ day: 7, cumulative: 20 }] },
      { id: 's', seedsSown: 30, sownSd: 8, checks: [], score: 'most' },
    ]);
    expect(mixed).toMatchObject({ percent: 80, sown: 25, seedsSownEstimated: false });
    const w = wilsonInterval(20, 25);
    expect(mixed.interval!.low).toBeCloseTo(100 * w.low, 12);
  });

  it('when a tray has both counts and a score, then it throws', () => {
    expect(() =>
      summarizeTest([{ id: 'x', seedsSown: 25, checks: [{ day: 7, cumulative: 2 }], score: 'few' }]),
    ).toThrow(RangeError);
  });
});
