import { describe, expect, it } from 'vitest';
import { probitRegressionGroups } from '#server/stats/index';
import { commonSlopeProbit } from '#server/stats/probit-common-slope';

/** A small seeded generator (mulberry32), so the data are the same on every run. */
function rng(seed: number) {
  let a = seed;
  return () => {
    a = (a + 0x6d2b79f5) | 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

describe('the common-slope probit fit', () => {
  it('when fitted to simulated lots, then it matches the dense reference fit', () => {
    const rand = rng(7);
    const groups = Array.from({ length: 25 }, () => {
      const ki = 1.2 + rand();
      return {
        points: Array.from({ length: 1 + Math.floor(rand() * 4) }, (_, j) => {
          const x = j * 0.8 + rand() * 0.4;
          // Binomial draws of 50 seeds at Φ(Ki − 0.6·x), by direct simulation.
          const p = 0.5 * (1 + Math.tanh((ki - 0.6 * x) * 0.8));
          let s = 0;
          for (let i = 0; i < 50; i++) if (rand() < p) s++;
          return { x, trials: 50, successes: s };
        }),
      };
    });
    const fast = commonSlopeProbit(groups);
    const dense = probitRegressionGroups(groups);
    expect(fast.converged).toBe(true);
    expect(fast.slope).toBeCloseTo(dense.slope, 6);
    expect(fast.seSlope).toBeCloseTo(dense.seSlope, 6);
    fast.intercepts.forEach((a, i) => expect(a).toBeCloseTo(dense.intercepts[i]!, 5));
    fast.seIntercepts.forEach((se, i) => expect(se).toBeCloseTo(dense.seIntercepts[i]!, 5));
    expect(fast.deviance).toBeCloseTo(dense.deviance, 5);
  });

  it('when no group has two distinct ages, then it refuses', () => {
    expect(() => commonSlopeProbit([{ points: [{ x: 1, trials: 10, successes: 5 }] }])).toThrow(RangeError);
  });
});
