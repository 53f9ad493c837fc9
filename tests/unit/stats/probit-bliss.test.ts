import { describe, expect, it } from 'vitest';
import { probitRegression } from '#server/stats/index';

// Bliss (1935), Ann. Appl. Biol. 22:134–167: beetles killed after five hours' exposure to gaseous
// carbon disulphide, as printed in Dobson & Barnett, An Introduction to Generalized Linear Models
// (3rd ed., 2008), Table 7.2. Dose is log10 CS2 mg/l. Values of the table from memory.
const BLISS = [
  { x: 1.6907, trials: 59, successes: 6 },
  { x: 1.7242, trials: 60, successes: 13 },
  { x: 1.7552, trials: 62, successes: 18 },
  { x: 1.7842, trials: 56, successes: 28 },
  { x: 1.8113, trials: 63, successes: 52 },
  { x: 1.8369, trials: 59, successes: 53 },
  { x: 1.861, trials: 62, successes: 61 },
  { x: 1.8839, trials: 60, successes: 60 },
];

describe('probit regression on Bliss’s beetle data', () => {
  it('when the probit model is fitted, then it reproduces the published estimates', () => {
    const fit = probitRegression(BLISS);
    expect(fit.converged).toBe(true);
    // Dobson & Barnett (2008), Table 7.3, probit model: b1 = −34.935, b2 = 19.728 (issue text: ≈ −34.94, 19.73).
    expect(fit.intercept).toBeCloseTo(-34.935, 2);
    expect(fit.slope).toBeCloseTo(19.728, 2);
    // Same table: standard errors 2.648 and 1.487 (from memory).
    expect(fit.seIntercept).toBeCloseTo(2.648, 1);
    expect(fit.seSlope).toBeCloseTo(1.487, 1);
  });
});
