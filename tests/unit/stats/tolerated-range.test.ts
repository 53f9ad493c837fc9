import jStat from 'jstat';
import { describe, expect, it } from 'vitest';
import {
  computedToleratedRange,
  maxToleratedRange,
  normalRangeCdf,
  normalRangeQuantile,
} from '#server/stats/index';
import { mulberry32 } from './seeded-random';

// The table of maximum tolerated ranges, 7 CFR 201.55 as printed (the same values as the ISTA
// Rules' table; transcribed in ../shared/REFERENCES.md). Each printed row pairs a mean of 71–99
// with one below it, row by row: 99 with 2, 98 with 3, … 71 with 30 — a mean m below 51 reads the
// row 101 − m. Rows 71–99 were read in the printed regulation [read]; rows 51–70 are from memory
// [memory] and are never a test's only expected value (each is checked against the formula behind
// the table and against the exact binomial range distribution, below).
//
// Four replicates of 100 seeds, rows 71–99 [read: 7 CFR 201.55 as printed], [mean, range]:
const FOUR_REPS_READ: [mean: number, range: number][] = [
  [99, 5],
  [98, 6],
  [97, 7],
  [96, 8],
  [95, 9],
  [94, 10],
  [93, 10],
  [92, 11],
  [91, 11],
  [90, 12],
  [89, 12],
  [88, 13],
  [87, 13],
  [86, 14],
  [85, 14],
  [84, 14],
  [83, 15],
  [82, 15],
  [81, 15],
  [80, 16],
  [79, 16],
  [78, 16],
  [77, 17],
  [76, 17],
  [75, 17],
  [74, 17],
  [73, 17],
  [72, 18],
  [71, 18],
];
// Four replicates of 100 seeds, rows 51–70: from memory [memory: 7 CFR 201.55, REFERENCES.md].
const FOUR_REPS_FROM_MEMORY: [mean: number, range: number][] = [
  [70, 18],
  [67, 18],
  [66, 19],
  [60, 19],
  [56, 19],
  [55, 20],
  [51, 20],
];
// Two replicates of 100 seeds, rows 71–97 [read: 7 CFR 201.55 as printed; rows 98 and 99 are blank].
const TWO_REPS_READ: [mean: number, range: number][] = [
  [97, 6],
  [96, 6],
  [95, 7],
  [94, 8],
  [93, 8],
  [92, 9],
  [91, 9],
  [90, 9],
  [89, 10],
  [88, 10],
  [87, 11],
  [86, 11],
  [85, 11],
  [84, 11],
  [83, 12],
  [82, 12],
  [81, 12],
  [80, 13],
  [79, 13],
  [78, 13],
  [77, 13],
  [76, 13],
  [75, 14],
  [74, 14],
  [73, 14],
  [72, 14],
  [71, 14],
];

describe('normalRangeQuantile', () => {
  it('when there are two replicates, then the quantile is √2·Φ⁻¹(1 − α/2) (closed form, jstat normal)', () => {
    // The range of two iid N(0,1) is |X₁ − X₂| = √2·|Z|: P(W ≤ w) = 2Φ(w/√2) − 1.
    expect(normalRangeQuantile(2, 0.975)).toBeCloseTo(Math.SQRT2 * jStat.normal.inv(0.9875, 0, 1), 9);
  });

  it('when there are four replicates at 2.5%, then q ≈ 3.98 (Miles 1963, as described by da Silva 2020)', () => {
    // REFERENCES.md: q ≈ 3.98 for four replicates at 2.5% (da Silva 2020, Seed Sci. Res. 30:59–63).
    expect(normalRangeQuantile(4, 0.975)).toBeCloseTo(3.98, 2);
  });

  it.each([
    [3, 0.95, 3.314],
    [4, 0.95, 3.633],
    [2, 0.95, 2.772],
  ])(
    'when k = %i at probability %f, then it matches the studentized range with infinite df (from memory)',
    (k, p, q) => {
      // Upper 5% points of the studentized range for df = ∞ (standard tables, e.g. Harter 1960) — from memory.
      expect(normalRangeQuantile(k, p)).toBeCloseTo(q, 3);
    },
  );

  it('when three normal replicates are simulated, then 97.5% of their ranges fall below the quantile', () => {
    // Independent Monte Carlo check (Box–Muller, 200 000 draws; binomial SE of the share ≈ 0.00035).
    const uniform = mulberry32(20240501);
    const normal = () => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
    const q = normalRangeQuantile(3, 0.975);
    const draws = 200_000;
    let inside = 0;
    for (let i = 0; i < draws; i++) {
      const a = normal();
      const b = normal();
      const c = normal();
      if (Math.max(a, b, c) - Math.min(a, b, c) <= q) inside += 1;
    }
    expect(Math.abs(inside / draws - 0.975)).toBeLessThan(0.0015);
  });

  it('when the cdf is evaluated, then it rises from 0 to 1', () => {
    // Any distribution function: F(0) = 0, F(∞) = 1, increasing.
    expect(normalRangeCdf(0, 4)).toBe(0);
    expect(normalRangeCdf(12, 4)).toBeCloseTo(1, 12);
    expect(normalRangeCdf(3, 4)).toBeLessThan(normalRangeCdf(4, 4));
  });
});

/**
 * P(range > r) for k replicates of n seeds germinating independently with probability p, exactly:
 * P(range ≤ r) = Σₐ [P(a ≤ X ≤ a + r)ᵏ − P(a + 1 ≤ X ≤ a + r)ᵏ] (the range of k iid discrete
 * variables; binomial probabilities from jstat).
 */
function exactRangeTail(k: number, n: number, p: number, r: number): number {
  const pdf = Array.from({ length: n + 1 }, (_, x) => jStat.binomial.pdf(x, n, p));
  const between = (a: number, b: number) =>
    pdf.slice(Math.max(a, 0), Math.min(b, n) + 1).reduce((s, v) => s + v, 0);
  let within = 0;
  for (let a = 0; a <= n; a++) within += between(a, a + r) ** k - between(a + 1, a + r) ** k;
  return 1 - within;
}

describe('maxToleratedRange', () => {
  it.each(FOUR_REPS_READ)(
    'when four replicates of 100 average %i percent, then the tolerated range is %i (7 CFR 201.55 as printed)',
    (mean, range) => {
      expect(maxToleratedRange(mean, 4, 100)).toBe(range);
    },
  );

  it.each(FOUR_REPS_READ)(
    'when four replicates of 100 average 101 − %i percent, then the paired row gives %i (7 CFR 201.55 as printed)',
    (row, range) => {
      // The printed table pairs rows 99 ↔ 2, 98 ↔ 3, … 71 ↔ 30.
      expect(maxToleratedRange(101 - row, 4, 100)).toBe(range);
    },
  );

  it.each(FOUR_REPS_FROM_MEMORY)(
    'when four replicates of 100 average %i percent, then the tolerated range is %i (row from memory, checked two independent ways)',
    (mean, range) => {
      // [memory] 7 CFR 201.55 row, so not the only check:
      expect(maxToleratedRange(mean)).toBe(range);
      expect(maxToleratedRange(101 - mean)).toBe(range); // the paired row below 51
      // (1) the formula behind the table (Miles 1963, as described by da Silva 2020) within one point;
      expect(Math.abs(computedToleratedRange(mean, 4, 100) - range)).toBeLessThanOrEqual(1);
      // (2) the exact binomial range distribution: the row's range holds the chance of exceeding it
      //     near the table's 2.5% (under 3%), and one point less would not (over 2.5%).
      expect(exactRangeTail(4, 100, mean / 100, range)).toBeLessThan(0.03);
      expect(exactRangeTail(4, 100, mean / 100, range - 1)).toBeGreaterThan(0.025);
    },
  );

  it.each(TWO_REPS_READ)(
    'when two replicates of 100 average %i percent, then the tolerated range is %i (7 CFR 201.55 as printed)',
    (mean, range) => {
      expect(maxToleratedRange(mean, 2, 100)).toBe(range);
      expect(maxToleratedRange(101 - mean, 2, 100)).toBe(range); // paired row 101 − mean (as printed)
    },
  );

  it('when the mean is below 51, then the table is read at 101 − mean, not 100 − mean (7 CFR 201.55 as printed)', () => {
    expect(maxToleratedRange(2)).toBe(5); // row 99 ↔ 2 → 5 (7 CFR 201.55 as printed)
    expect(maxToleratedRange(10)).toBe(11); // row 91 ↔ 10 → 11, not row 90's 12 (7 CFR 201.55 as printed)
    expect(maxToleratedRange(17)).toBe(14); // row 84 ↔ 17 → 14, not row 83's 15 (7 CFR 201.55 as printed)
    expect(maxToleratedRange(30)).toBe(18); // row 71 ↔ 30 → 18 (7 CFR 201.55 as printed)
    expect(maxToleratedRange(25, 2)).toBe(13); // row 76 ↔ 25 → 13, not row 75's 14 (7 CFR 201.55 as printed)
    expect(maxToleratedRange(4, 2)).toBe(6); // row 97 ↔ 4 → 6 (7 CFR 201.55 as printed)
  });

  it('when the mean is fractional, then it is first rounded to the whole percent (ISTA Rules ch. 5 reporting)', () => {
    expect(maxToleratedRange(88.5)).toBe(12); // 89 → 12 (7 CFR 201.55)
    expect(maxToleratedRange(88.4)).toBe(13); // 88 → 13 (7 CFR 201.55)
  });

  it('when the mean rounds to 100, 1 or 0, then the last printed row (99) applies', () => {
    // 7 CFR 201.55 as printed has no row for 100 (nor its pair 1); Hilum's documented choice is row 99 → 5.
    expect(maxToleratedRange(99.75)).toBe(5);
    expect(maxToleratedRange(1)).toBe(5);
    expect(maxToleratedRange(0)).toBe(5);
  });

  it('when the design is not in the table, then the range is q·√(p(100 − p)/n) (Miles 1963 via da Silva 2020)', () => {
    // Three replicates of 100 at 90%: q₃(0.975) from the range distribution, sd = √(90·10/100) = 3.
    expect(maxToleratedRange(90, 3, 100)).toBeCloseTo(normalRangeQuantile(3, 0.975) * 3, 10);
    // Four replicates of 50 at 80%: sd = √(80·20/50) = √32; q ≈ 3.98 (da Silva 2020) → ≈ 22.5.
    expect(maxToleratedRange(80, 4, 50)).toBeCloseTo(normalRangeQuantile(4, 0.975) * Math.sqrt(32), 10);
    expect(maxToleratedRange(80, 4, 50)).toBeCloseTo(22.5, 1);
    // Two replicates of 100 at 99% (no printed row): √2·Φ⁻¹(0.9875)·√(99·1/100) (closed form).
    expect(maxToleratedRange(99, 2, 100)).toBeCloseTo(
      Math.SQRT2 * jStat.normal.inv(0.9875, 0, 1) * Math.sqrt(0.99),
      8,
    );
  });

  it('when the computed method is applied to the printed designs, then it stays within about one point of every row', () => {
    // da Silva 2020: the formula, rounded, does not reproduce every printed row, but comes close.
    for (const [mean, range] of FOUR_REPS_READ) {
      expect(Math.abs(computedToleratedRange(mean, 4, 100) - range)).toBeLessThan(1.1);
    }
    for (const [mean, range] of TWO_REPS_READ) {
      expect(Math.abs(computedToleratedRange(mean, 2, 100) - range)).toBeLessThan(1.1);
    }
  });

  it('when the arguments are nonsense, then it throws a RangeError', () => {
    expect(() => maxToleratedRange(101)).toThrow(RangeError);
    expect(() => maxToleratedRange(-1)).toThrow(RangeError);
    expect(() => maxToleratedRange(90, 1)).toThrow(RangeError);
    expect(() => maxToleratedRange(90, 2.5)).toThrow(RangeError);
    expect(() => maxToleratedRange(90, 4, 0)).toThrow(RangeError);
  });
});
