import jStat from 'jstat';
import { describe, expect, it } from 'vitest';
import { clopperPearsonInterval, wilsonInterval } from '#server/stats/index';

const Z95 = jStat.normal.inv(0.975, 0, 1);

/** Independent Wilson bound: bisection on the score statistic (p̂ − p)/√(p(1 − p)/n) = ±z. */
function scoreBound(x: number, n: number, side: 'low' | 'high'): number {
  const phat = x / n;
  const score = (p: number) => (phat - p) / Math.sqrt((p * (1 - p)) / n);
  let a = side === 'low' ? 1e-15 : phat;
  let b = side === 'low' ? phat : 1 - 1e-15;
  for (let i = 0; i < 200; i++) {
    const mid = (a + b) / 2;
    const s = score(mid);
    if (side === 'low' ? s > Z95 : s > -Z95) a = mid;
    else b = mid;
  }
  return (a + b) / 2;
}

/** P(X ≥ x) and P(X ≤ x) for Binomial(n, p), by direct summation of jstat's binomial pdf. */
function upperTail(x: number, n: number, p: number): number {
  let s = 0;
  for (let j = x; j <= n; j++) s += jStat.binomial.pdf(j, n, p);
  return s;
}
function lowerTail(x: number, n: number, p: number): number {
  let s = 0;
  for (let j = 0; j <= x; j++) s += jStat.binomial.pdf(j, n, p);
  return s;
}

describe('wilsonInterval', () => {
  // Newcombe 1998, Stat. Med. 17:857–872, Table II (method: score without continuity correction),
  // as quoted in Hilum's issue text.
  it.each([
    [81, 263, 0.2553, 0.3662], // Newcombe 1998, Table II, as quoted in Hilum's issue text
    [0, 20, 0, 0.1611], // Newcombe 1998, Table II, as quoted in Hilum's issue text
  ])('when %i of %i succeed, then the 95 percent bounds match Newcombe 1998 Table II', (x, n, low, high) => {
    const interval = wilsonInterval(x, n);
    expect(interval.low).toBeCloseTo(low, 4);
    expect(interval.high).toBeCloseTo(high, 4);
  });

  // Further rows of the same Newcombe 1998 examples — from memory.
  it.each([
    [15, 148, 0.0624, 0.1605], // from memory
    [1, 29, 0.0061, 0.1718], // from memory
  ])(
    'when %i of %i succeed, then the 95 percent bounds match Newcombe 1998 (from memory)',
    (x, n, low, high) => {
      const interval = wilsonInterval(x, n);
      expect(interval.low).toBeCloseTo(low, 4);
      expect(interval.high).toBeCloseTo(high, 4);
    },
  );

  it.each([
    [81, 263],
    [15, 148],
    [1, 29],
    [7, 8],
    [350, 400],
  ])('when %i of %i succeed, then the bounds invert the score test (independent bisection)', (x, n) => {
    const interval = wilsonInterval(x, n);
    expect(interval.low).toBeCloseTo(scoreBound(x, n, 'low'), 10);
    expect(interval.high).toBeCloseTo(scoreBound(x, n, 'high'), 10);
  });

  it('when nothing or everything germinated, then the bounds are exactly 0 or exactly 1', () => {
    // Wilson 1927 score interval: at x = 0 the lower bound is 0 and at x = n the upper bound is 1 (algebra).
    expect(wilsonInterval(0, 100).low).toBe(0);
    expect(wilsonInterval(100, 100).high).toBe(1);
    // Symmetry of the score interval: bounds of x/n mirror those of (n − x)/n.
    expect(wilsonInterval(100, 100).low).toBeCloseTo(1 - wilsonInterval(0, 100).high, 14);
  });

  it('when the confidence level rises, then the interval widens', () => {
    // Property of any confidence interval family (nested levels).
    const a = wilsonInterval(80, 100, 0.9);
    const b = wilsonInterval(80, 100, 0.99);
    expect(b.low).toBeLessThan(a.low);
    expect(b.high).toBeGreaterThan(a.high);
  });

  it('when the counts are nonsense, then it throws a RangeError', () => {
    expect(() => wilsonInterval(11, 10)).toThrow(RangeError);
    expect(() => wilsonInterval(-1, 10)).toThrow(RangeError);
    expect(() => wilsonInterval(1.5, 10)).toThrow(RangeError);
    expect(() => wilsonInterval(0, 0)).toThrow(RangeError);
    expect(() => wilsonInterval(5, 10, 1)).toThrow(RangeError);
  });
});

describe('clopperPearsonInterval', () => {
  // Newcombe 1998, Stat. Med. 17:857–872, Table II (method: exact, Clopper–Pearson), as quoted in
  // Hilum's issue text.
  it.each([
    [81, 263, 0.2527, 0.3676], // Newcombe 1998, Table II, as quoted in Hilum's issue text
    [0, 20, 0, 0.1684], // Newcombe 1998, Table II, as quoted in Hilum's issue text
  ])('when %i of %i succeed, then the 95 percent bounds match Newcombe 1998 Table II', (x, n, low, high) => {
    const interval = clopperPearsonInterval(x, n);
    expect(interval.low).toBeCloseTo(low, 4);
    expect(interval.high).toBeCloseTo(high, 4);
  });

  // Further rows of the same Newcombe 1998 examples — from memory.
  it.each([
    [15, 148, 0.0578, 0.1617], // from memory
    [1, 29, 0.0009, 0.1776], // from memory
  ])(
    'when %i of %i succeed, then the 95 percent bounds match Newcombe 1998 (from memory)',
    (x, n, low, high) => {
      const interval = clopperPearsonInterval(x, n);
      expect(interval.low).toBeCloseTo(low, 4);
      expect(interval.high).toBeCloseTo(high, 4);
    },
  );

  it.each([
    [81, 263],
    [15, 148],
    [1, 29],
    [92, 100],
    [7, 8],
  ])(
    'when %i of %i succeed, then each bound leaves 2.5 percent in the binomial tail (jstat binomial pdf sums)',
    (x, n) => {
      // Definition of the exact interval (Clopper & Pearson 1934): P(X ≥ x | low) = P(X ≤ x | high) = α/2.
      const { low, high } = clopperPearsonInterval(x, n);
      expect(upperTail(x, n, low)).toBeCloseTo(0.025, 8);
      expect(lowerTail(x, n, high)).toBeCloseTo(0.025, 8);
    },
  );

  it('when nothing or everything germinated, then the open bound is exactly 0 or 1 and the other has its closed form', () => {
    // Closed forms of the exact interval: x = 0 → [0, 1 − (α/2)^(1/n)]; x = n → [(α/2)^(1/n), 1].
    const none = clopperPearsonInterval(0, 50);
    expect(none.low).toBe(0);
    expect(none.high).toBeCloseTo(1 - 0.025 ** (1 / 50), 10);
    const all = clopperPearsonInterval(50, 50);
    expect(all.high).toBe(1);
    expect(all.low).toBeCloseTo(0.025 ** (1 / 50), 10);
  });

  it('when compared with the Wilson interval, then it is the wider (conservative) one', () => {
    // Newcombe 1998: the exact interval is conservative; at 81/263 it contains the score interval.
    const exact = clopperPearsonInterval(81, 263);
    const score = wilsonInterval(81, 263);
    expect(exact.low).toBeLessThan(score.low);
    expect(exact.high).toBeGreaterThan(score.high);
  });

  it('when the counts are nonsense, then it throws a RangeError', () => {
    expect(() => clopperPearsonInterval(3, 2)).toThrow(RangeError);
    expect(() => clopperPearsonInterval(0, -1)).toThrow(RangeError);
    expect(() => clopperPearsonInterval(1, 2, 0)).toThrow(RangeError);
  });
});
