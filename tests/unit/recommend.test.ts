import { describe, expect, it } from 'vitest';
import { decide, retestDueDate, type DecisionInput } from '#server/modules/viability/recommend';

/*
 * The decision rules of docs/decisions.md, branch by branch and boundary by boundary. Sources of the
 * figures: the tomato minimum of 75% is the US standard for vegetable seed (7 CFR 201.31 [read]);
 * 30%, 90 days, a year and three years are Hilum's rules; 85% of initial viability is the FAO
 * Genebank Standards 2014 regeneration rule (4.3.4) [memory], never a test's only check: where it
 * is used, a second expectation rests on 4.3.2 [read, quoted] (a fresh accession should germinate
 * above 85%). Dates in words follow the Gregorian calendar (common practice).
 */

/** A tomato lot tested last autumn, well above the standard, nothing pending. */
const base: DecisionInput = {
  on: '2027-03-29',
  today: '2027-01-10',
  seedsOnHand: 200,
  seedsNeeded: null,
  tested: true,
  assayRunning: false,
  estimateOnly: false,
  projected: { percent: 90, low: 82, high: 95 },
  projectedNextSeason: { percent: 88, low: 78, high: 94 },
  initialPercent: 94,
  lastTestDate: '2026-11-02',
  monitoringIntervalDays: 400,
  threshold: 75, // tomato, 7 CFR 201.31 [read]
  thresholdIsStandard: true,
  establishment: 0.9,
  youngerLotOfVariety: false,
  noFitReason: null,
};
/** A band either side of the tomato standard of 75%: 70–85. */
const straddling = { percent: 78, low: 70, high: 85 };
/** A band wholly under the tomato standard, but usable: 40–70. */
const thinBand = { percent: 60, low: 40, high: 70 };

describe('retire', () => {
  it('when no seeds are left, then retire, whatever the projection and even untested', () => {
    expect(decide({ ...base, seedsOnHand: 0 })).toEqual({
      recommendation: 'retire',
      reason: 'No seeds left in the ledger: nothing to sow.',
    });
    expect(decide({ ...base, seedsOnHand: -3 }).recommendation).toBe('retire');
    expect(decide({ ...base, seedsOnHand: 0, tested: false, assayRunning: true }).recommendation).toBe(
      'retire',
    );
  });

  it('when the amount is not known, then it is never "no seeds left", tested or not', () => {
    // Not known is not zero (issue 16): the advice comes from the lot's germination alone.
    expect(decide({ ...base, seedsOnHand: null }).recommendation).toBe(decide(base).recommendation);
    const untested = decide({ ...base, seedsOnHand: null, tested: false });
    expect(untested.recommendation).not.toBe('retire');
    expect(untested.reason).not.toMatch(/no seeds left/i);
    // And a plan's need never reads it as short.
    expect(decide({ ...base, seedsOnHand: null, seedsNeeded: 60 }).reason).not.toMatch(/short of/);
  });

  it('when a tested lot’s upper bound is under 30%, then retire, naming the sowing day in words', () => {
    // 30% is Hilum's rule; 2027-03-29 is 29 Mar 2027.
    const out = decide({ ...base, projected: { percent: 12, low: 6, high: 29.9 } });
    expect(out.recommendation).toBe('retire');
    expect(out.reason).toBe(
      'Projected 12% (likely 6%–29.9%) on 29 Mar 2027: at best 29.9%, too few would come up to be worth the tray space.',
    );
  });

  it('when the upper bound is exactly 30%, then the lot is not retired but sown thickly', () => {
    const out = decide({ ...base, projected: { percent: 18, low: 9, high: 30 } });
    expect(out.recommendation).toBe('sow-thick');
  });

  it('when an untested lot’s estimate is under 30% at best, then test first: a guess never retires a lot', () => {
    const out = decide({
      ...base,
      tested: false,
      estimateOnly: true,
      lastTestDate: null,
      projected: { percent: 10, low: 2, high: 25 },
    });
    expect(out.recommendation).toBe('test-first');
    expect(out.reason).toContain('a test will tell whether to retire it');
  });
});

describe('test first', () => {
  const untested: DecisionInput = {
    ...base,
    tested: false,
    estimateOnly: true,
    lastTestDate: null,
    initialPercent: null,
    projected: { percent: 70, low: 35, high: 92 },
    projectedNextSeason: { percent: 60, low: 25, high: 88 },
  };

  it('when a lot was never tested, then test first in its own words, quoting the estimate as a guess', () => {
    expect(decide(untested)).toEqual({
      recommendation: 'test-first',
      reason:
        "Never tested. The species' typical figures guess 70% (likely 35%–92%) on 29 Mar 2027: a guess, not a measurement. Test about 20 seeds before relying on it.",
    });
    expect(decide(untested).reason).not.toMatch(/retest/i);
  });

  it('when the lot’s first test is running, then test first, and its result will decide', () => {
    const out = decide({ ...untested, assayRunning: true });
    expect(out.recommendation).toBe('test-first');
    expect(out.reason).toMatch(
      /^A test of this lot is running; its result will decide\. Until then, the species'/,
    );
    expect(out.reason).not.toContain('Test about 20 seeds');
  });

  it('when a lot was never tested and nothing is known to estimate from, then test first, with the reason why', () => {
    const out = decide({
      ...untested,
      projected: null,
      projectedNextSeason: null,
      estimateOnly: false,
      noFitReason: 'No typical figures are known for this species.',
    });
    expect(out).toEqual({
      recommendation: 'test-first',
      reason:
        'Never tested. No typical figures are known for this species. Test about 20 seeds before relying on it.',
    });
  });

  it('when an untested lot would otherwise need growing out or is short of seed, then test first comes before', () => {
    const out = decide({ ...untested, initialPercent: 95, seedsOnHand: 10, seedsNeeded: 60 });
    expect(out.recommendation).toBe('test-first');
  });
});

describe('retest', () => {
  // Last tested 1 Oct 2025; the species' interval is 400 days, so the recheck falls due
  // 2025-10-01 + 400 days = 5 Nov 2026 (92 days to 1 Jan 2026, 365 to 1 Jan 2027 … counted by
  // calendar: Oct 31, Nov 30, Dec 31 = 92 → 1 Jan 2026; + 308 days → 5 Nov 2026).
  const stale: DecisionInput = { ...base, projected: straddling, lastTestDate: '2025-10-01' };

  it('when the band straddles the threshold and the last test is past the interval, then retest, with its days in words', () => {
    expect(decide(stale)).toEqual({
      recommendation: 'retest',
      reason:
        "Projected 78% (likely 70%–85%) on 29 Mar 2027, either side of the species' 75% minimum standard: a new test would settle whether to sow it as usual or thickly. The last test, on 1 Oct 2025, was due for a recheck on 5 Nov 2026 (the checking interval for the species where the lot is kept).",
    });
  });

  it('when the interval runs out exactly today, then retest; the day before, not yet', () => {
    expect(decide({ ...stale, today: '2026-11-05' }).recommendation).toBe('retest');
    // 4 Nov 2026 is one day short of the interval: the band under-reaches, so sow thick.
    expect(decide({ ...stale, today: '2026-11-04' }).recommendation).toBe('sow-thick');
  });

  it('when the threshold is exactly the band’s upper bound, then the band still straddles it', () => {
    expect(decide({ ...stale, projected: { percent: 70, low: 60, high: 75 } }).recommendation).toBe('retest');
    // Wholly under (high 74.9): a new test would still say sow thick.
    expect(decide({ ...stale, projected: { percent: 70, low: 60, high: 74.9 } }).recommendation).toBe(
      'sow-thick',
    );
  });

  it('when a lot was tested yesterday, then it is never told to retest, whatever its band or interval', () => {
    const yesterday = '2027-01-09';
    const bands = [
      straddling,
      thinBand,
      { percent: 50, low: 5, high: 97 },
      { percent: 90, low: 82, high: 95 },
    ];
    for (const projected of bands) {
      for (const monitoringIntervalDays of [0, 1, 30, null]) {
        for (const on of ['2027-01-10', '2027-03-29', '2028-01-10']) {
          const out = decide({ ...base, on, projected, lastTestDate: yesterday, monitoringIntervalDays });
          expect(out.recommendation).not.toBe('retest');
        }
      }
    }
  });

  it('when the interval is shorter than 90 days, then a retest still waits 90 days from the last test', () => {
    // An interval of zero: the lot is already under 85% of its initial viability. 90 days is Hilum's rule.
    const lot = { ...base, projected: straddling, lastTestDate: '2026-10-12', monitoringIntervalDays: 0 };
    // 2026-10-12 + 90 days = 10 Jan 2027 (19 left in Oct, 30 in Nov, 31 in Dec, 10 in Jan).
    expect(decide({ ...lot, today: '2027-01-09' }).recommendation).toBe('sow-thick');
    const out = decide({ ...lot, today: '2027-01-10' });
    expect(out.recommendation).toBe('retest');
    expect(out.reason).toContain(
      'due for a recheck on 10 Jan 2027 (90 days on, the shortest wait Hilum asks between tests)',
    );
  });

  it('when the species’ interval is unknown, then a year is used', () => {
    const lot = { ...base, projected: straddling, lastTestDate: '2026-01-10', monitoringIntervalDays: null };
    // 2026-01-10 + 365 days = 10 Jan 2027 (2026 is a common year).
    expect(decide({ ...lot, today: '2027-01-09' }).recommendation).toBe('sow-thick');
    const out = decide({ ...lot, today: '2027-01-10' });
    expect(out.recommendation).toBe('retest');
    expect(out.reason).toContain('(a year on, as no checking interval is known for the species)');
  });

  it('when the band sits clear of the threshold, then an old test inside the cap asks for no retest', () => {
    // Two years and more since the test, far past the 400-day interval, but the band is wholly above 75%.
    expect(decide({ ...base, lastTestDate: '2024-12-01' }).recommendation).toBe('sow');
    // And wholly under it: sow thick.
    expect(decide({ ...base, projected: thinBand, lastTestDate: '2024-12-01' }).recommendation).toBe(
      'sow-thick',
    );
  });

  it('when the last test is three years old, then retest whatever the band; a day younger, not', () => {
    // 2024-01-10 + 1095 days = 9 Jan 2027 (2024 is a leap year, so three calendar years are 1096 days).
    const lot = { ...base, lastTestDate: '2024-01-10' };
    expect(decide({ ...lot, today: '2027-01-08' }).recommendation).toBe('sow');
    const out = decide({ ...lot, today: '2027-01-09' });
    expect(out).toEqual({
      recommendation: 'retest',
      reason:
        'Projected 90% (likely 82%–95%) on 29 Mar 2027, but the last test, on 10 Jan 2024, is 3 years old or more: test again before relying on it.',
    });
  });

  it('when a new test of the lot is running, then it asks for no other, and says the result will update the advice', () => {
    const out = decide({ ...stale, assayRunning: true });
    expect(out.recommendation).toBe('sow-thick');
    expect(out.reason).toMatch(/A test of this lot is running now; its result will update this advice\.$/);
    expect(decide({ ...base, lastTestDate: '2020-01-10', assayRunning: true }).recommendation).toBe('sow');
  });

  it('when no day of advice is given, then the last test’s age is counted to the sowing day', () => {
    const { today: _today, ...withoutToday } = stale;
    // 5 Nov 2026 is due; counted to the sowing day, 29 Mar 2027, it has run out.
    expect(decide(withoutToday).recommendation).toBe('retest');
    expect(decide({ ...withoutToday, on: '2026-11-04' }).recommendation).toBe('sow-thick');
  });

  it('when asked for the retest date, then it is the interval for a straddling band and the cap otherwise', () => {
    expect(retestDueDate('2025-10-01', 400, true)).toBe('2026-11-05');
    expect(retestDueDate('2025-10-01', 400, false)).toBe('2028-09-30'); // + 1095 days (2028 is a leap year)
    expect(retestDueDate('2025-10-01', 2000, true)).toBe('2028-09-30'); // never past the cap
    expect(retestDueDate('2025-10-01', null, true)).toBe('2026-10-01'); // a year
    expect(retestDueDate('2025-10-01', 10, true)).toBe('2025-12-30'); // 90 days at least
  });
});

describe('grow out', () => {
  /** Projected at 80% next season from a start of 95%: 80 < 85% × 95 = 80.75. */
  const fading: DecisionInput = {
    ...base,
    initialPercent: 95,
    projectedNextSeason: { percent: 80, low: 70, high: 88 },
  };

  it('when next season’s projection falls under 85% of the initial viability, then grow it out this year', () => {
    const out = decide(fading);
    expect(out.recommendation).toBe('grow-out');
    expect(out.reason).toBe(
      'Projected 90% (likely 82%–95%) on 29 Mar 2027, but by 29 Mar 2028 it is projected at 80%, under 85% of its starting 95% (the genebank rule for renewing seed); no younger lot of this variety is in the bank. Grow it out this year: sow it and save seed from the plants for a fresh lot. To keep the variety true, save from several plants kept apart from other varieties that could cross with them (seed saved from a hybrid does not come true).',
    );
    // A second check resting on a read value: from a start of 100%, a lot projected at 84% next
    // season falls below the 85% a genebank asks of fresh seed (FAO 2014, 4.3.2 [read, quoted]).
    expect(
      decide({ ...fading, initialPercent: 100, projectedNextSeason: { percent: 84, low: 75, high: 90 } })
        .recommendation,
    ).toBe('grow-out');
  });

  it('when next season’s projection is exactly 85% of the initial viability, then it is not under it', () => {
    // 85% × 100 = 85 and 85% × 90 = 76.5 (arithmetic): on the line, sow as usual.
    expect(
      decide({ ...fading, initialPercent: 100, projectedNextSeason: { percent: 85, low: 78, high: 90 } })
        .recommendation,
    ).toBe('sow');
    expect(
      decide({ ...fading, initialPercent: 90, projectedNextSeason: { percent: 76.5, low: 70, high: 82 } })
        .recommendation,
    ).toBe('sow');
    expect(
      decide({ ...fading, initialPercent: 90, projectedNextSeason: { percent: 76.4, low: 70, high: 82 } })
        .recommendation,
    ).toBe('grow-out');
  });

  it('when the stock is short of what the plan needs from the lot, then grow it out for more seed', () => {
    const out = decide({ ...base, seedsOnHand: 40, seedsNeeded: 60 });
    expect(out.recommendation).toBe('grow-out');
    expect(out.reason).toContain('but only 40 seeds are left, short of the 60 the plan needs from it;');
    // Exactly enough: not short.
    expect(decide({ ...base, seedsOnHand: 60, seedsNeeded: 60 }).recommendation).toBe('sow');
    // No plan entry needs the lot: not short.
    expect(decide({ ...base, seedsOnHand: 5, seedsNeeded: null }).recommendation).toBe('sow');
  });

  it('when both reasons hold, then the reason gives both', () => {
    const out = decide({ ...fading, seedsOnHand: 40, seedsNeeded: 60 });
    expect(out.recommendation).toBe('grow-out');
    expect(out.reason).toContain('(the genebank rule for renewing seed), and only 40 seeds are left');
  });

  it('when a younger lot of the variety is in the bank, then the old lot is not grown out but sown', () => {
    const out = decide({ ...fading, youngerLotOfVariety: true });
    expect(out).toEqual({
      recommendation: 'sow',
      reason:
        "Projected 90% (likely 82%–95%) on 29 Mar 2027: even the low end reaches the species' 75% minimum standard. Sow as usual. A younger lot of this variety is in the bank to carry it on.",
    });
    expect(
      decide({ ...base, seedsOnHand: 40, seedsNeeded: 60, youngerLotOfVariety: true }).recommendation,
    ).toBe('sow');
  });

  it('when a lot to grow out comes up thinly, then the reason also says how many seeds per plant', () => {
    const out = decide({ ...fading, projected: thinBand });
    expect(out.recommendation).toBe('grow-out');
    // 1 ÷ (0.60 × 0.9) = 1.85 seeds per plant (arithmetic).
    expect(out.reason).toContain('Sow about 1.9 seeds for each plant wanted');
  });

  it('when the lot is past use or its test is due, then retire or retest come before growing out', () => {
    expect(decide({ ...fading, projected: { percent: 15, low: 8, high: 25 } }).recommendation).toBe('retire');
    expect(decide({ ...fading, seedsOnHand: 0 }).recommendation).toBe('retire');
    expect(decide({ ...fading, projected: straddling, lastTestDate: '2025-10-01' }).recommendation).toBe(
      'retest',
    );
  });
});

describe('sow and sow thick', () => {
  it('when the lot is well above the standard, then sow, with the reason in words', () => {
    expect(decide(base)).toEqual({
      recommendation: 'sow',
      reason:
        "Projected 90% (likely 82%–95%) on 29 Mar 2027: even the low end reaches the species' 75% minimum standard. Sow as usual.",
    });
  });

  it('when the lower bound is exactly the threshold, then sow', () => {
    // Tomato 75% (7 CFR 201.31 [read]): a low end of 75 reaches it.
    expect(decide({ ...base, projected: { percent: 83, low: 75, high: 90 } }).recommendation).toBe('sow');
  });

  it('when the lower bound is just under the threshold, then sow thick, saying how many seeds per plant', () => {
    const out = decide({ ...base, projected: { percent: 80, low: 74.9, high: 86 } });
    expect(out).toEqual({
      recommendation: 'sow-thick',
      // 1 ÷ (0.80 × 0.9) = 1.39 (arithmetic); 0.9 is the bank's share of seedlings that make a plant.
      // The low end shows a decimal: rounded, 74.9 would read as the 75% it falls short of.
      reason:
        "Projected 80% (likely 74.9%–86%) on 29 Mar 2027: the low end is under the species' 75% minimum standard. Sow about 1.4 seeds for each plant wanted (80% expected to come up, and 90% of seedlings making a plant).",
    });
  });

  it('when the threshold is the bank’s own, then the reason says so', () => {
    const out = decide({ ...base, threshold: 92, thresholdIsStandard: false });
    expect(out.recommendation).toBe('sow-thick');
    expect(out.reason).toContain("the low end is under the bank's 92% threshold.");
  });

  it('when ten or more seeds are needed per plant, then the count is a whole number, rounded up', () => {
    // 1 ÷ (0.10 × 0.9) = 11.1, rounded up to 12 (arithmetic).
    const out = decide({ ...base, projected: { percent: 10, low: 3, high: 31 } });
    expect(out.recommendation).toBe('sow-thick');
    expect(out.reason).toContain('Sow about 12 seeds for each plant wanted');
  });

  it('when nothing is expected to come up yet the band reaches 30%, then it says to sow as thickly as you can spare', () => {
    const out = decide({ ...base, projected: { percent: 0, low: 0, high: 31 } });
    expect(out.recommendation).toBe('sow-thick');
    expect(out.reason).toContain('sow it as thickly as you can spare');
  });
});

describe('a tested lot without a projection', () => {
  const unfitted: DecisionInput = {
    ...base,
    projected: null,
    projectedNextSeason: null,
    noFitReason: 'The decline cannot be estimated yet.',
  };

  it('when the latest test’s own result is given, then the advice rests on it and says why', () => {
    const out = decide({ ...unfitted, latestResult: { percent: 88, low: 78, high: 94 } });
    expect(out).toEqual({
      recommendation: 'sow',
      reason:
        "The latest test found 88% (likely 78%–94%): even the low end reaches the species' 75% minimum standard. Sow as usual. The decline cannot be estimated yet.",
    });
  });

  it('when there is no figure at all, then test first, saying so plainly', () => {
    const out = decide(unfitted);
    expect(out.recommendation).toBe('test-first');
    expect(out.reason).toBe(
      'The decline cannot be estimated yet. Its tests give nothing to decide by: test about 20 seeds before relying on it.',
    );
  });
});
