import jStat from 'jstat';
import { describe, expect, it } from 'vitest';
import { binomialUpperTail, seedsToSow } from '#server/stats/index';

/** P(X ≥ k), X ~ Binomial(n, p), summed term by term from jstat's log-combination. */
function jstatUpperTail(k: number, n: number, p: number): number {
  let s = 0;
  for (let j = k; j <= n; j++)
    s += Math.exp(jStat.combinationln(n, j) + j * Math.log(p) + (n - j) * Math.log(1 - p));
  return s;
}

describe('binomialUpperTail', () => {
  it.each([
    [5, 10, 0.5],
    [80, 100, 0.85],
    [90, 100, 0.85],
    [1, 30, 0.02],
    [950, 1000, 0.93],
  ])('when P(X ≥ %i) for n = %i, p = %f, then it equals the sum of jstat binomial pdf terms', (k, n, p) => {
    let direct = 0;
    for (let j = k; j <= n; j++) direct += jStat.binomial.pdf(j, n, p);
    expect(binomialUpperTail(k, n, p)).toBeCloseTo(direct, 10);
  });

  it('when n is in the thousands, then it matches term-by-term sums from jstat log-combinations', () => {
    // jstat's log-gamma (a Lanczos series) is good to about 2e-10, which bounds the agreement here.
    expect(binomialUpperTail(2400, 5000, 0.5)).toBeCloseTo(jstatUpperTail(2400, 5000, 0.5), 8);
    expect(binomialUpperTail(4000, 6000, 0.68)).toBeCloseTo(jstatUpperTail(4000, 6000, 0.68), 8);
    // Symmetry of Binomial(n, ½): P(X ≥ 100 | n = 199) = ½ exactly.
    expect(binomialUpperTail(100, 199, 0.5)).toBeCloseTo(0.5, 14);
    expect(binomialUpperTail(1000, 1200, 0.8)).toBeCloseTo(1 - jStat.binomial.cdf(999, 1200, 0.8), 9); // jstat cdf (rounded to 1e-10)
  });
});

describe('seedsToSow', () => {
  it.each([
    [10, 0.8, 0.9],
    [10, 0.8, 0.99],
    [24, 0.65, 0.9],
    [50, 0.92, 0.95],
    [6, 0.3, 0.8],
    [100, 0.5, 0.75],
  ])(
    'when %i plants are wanted at germination %f with assurance %f, then n is the least with enough probability (jstat sums)',
    (plants, p, assurance) => {
      const n = seedsToSow(plants, p, assurance);
      let tail = 0;
      let tailBefore = 0;
      for (let j = plants; j <= n; j++) tail += jStat.binomial.pdf(j, n, p);
      for (let j = plants; j <= n - 1; j++) tailBefore += jStat.binomial.pdf(j, n - 1, p);
      expect(tail).toBeGreaterThanOrEqual(assurance);
      expect(tailBefore).toBeLessThan(assurance);
    },
  );

  it('when thousands of plants are wanted, then the answer is still the least sufficient n (jstat log-combination sums)', () => {
    const n = seedsToSow(2000, 0.7, 0.95);
    expect(jstatUpperTail(2000, n, 0.7)).toBeGreaterThanOrEqual(0.95);
    expect(jstatUpperTail(2000, n - 1, 0.7)).toBeLessThan(0.95);
    // Normal approximation with continuity correction as a sanity check: n·p − z√(n·p(1 − p)) = k − ½.
    const z = jStat.normal.inv(0.95, 0, 1);
    let approx = 2000 / 0.7;
    for (let i = 0; i < 50; i++) approx = (2000 - 0.5 + z * Math.sqrt(approx * 0.7 * 0.3)) / 0.7;
    expect(Math.abs(n - approx)).toBeLessThan(3);
  });

  it('when one plant is wanted at 50% germination with 90% assurance, then 4 seeds (1 − 0.5ⁿ ≥ 0.9)', () => {
    // Closed form: P(at least one) = 1 − (1 − p)ⁿ; n = 4 gives 0.9375, n = 3 gives 0.875.
    expect(seedsToSow(1, 0.5, 0.9)).toBe(4);
  });

  it('when every seed germinates, then the number of plants is enough', () => {
    expect(seedsToSow(12, 1, 0.99)).toBe(12);
  });

  it('when the arguments are nonsense, then it throws a RangeError', () => {
    expect(() => seedsToSow(10, 0, 0.9)).toThrow(RangeError);
    expect(() => seedsToSow(10, -0.2, 0.9)).toThrow(RangeError);
    expect(() => seedsToSow(10, 1.2, 0.9)).toThrow(RangeError);
    expect(() => seedsToSow(0, 0.8, 0.9)).toThrow(RangeError);
    expect(() => seedsToSow(2.5, 0.8, 0.9)).toThrow(RangeError);
    expect(() => seedsToSow(10, 0.8, 1)).toThrow(RangeError);
    expect(() => seedsToSow(10, 0.8, 0)).toThrow(RangeError);
  });
});
