import jStat from 'jstat';
import { describe, expect, it } from 'vitest';
import { probitRegression, probitRegressionGroups } from '#server/stats/index';
import type { DosePoint } from '#server/stats/index';
import { mulberry32 } from './seeded-random';

// Inputs below are illustrative counts; every expected value comes from an independent computation
// written here (a direct search of the log-likelihood, the information matrix written out by hand)
// or from simulation with known parameters.

function binomialDraw(n: number, p: number, uniform: () => number): number {
  let k = 0;
  for (let i = 0; i < n; i++) if (uniform() < p) k += 1;
  return k;
}

const PHI = (x: number) => jStat.normal.cdf(x, 0, 1);

/** Binomial log-likelihood of Φ(a + b·x), written independently of the module. */
function logLik(points: readonly DosePoint[], a: number, b: number): number {
  return points.reduce((s, p) => {
    const eta = a + b * p.x;
    return s + p.successes * Math.log(PHI(eta)) + (p.trials - p.successes) * Math.log(PHI(-eta));
  }, 0);
}

/** Coarse-to-fine grid search of a concave log-likelihood (probit log-likelihood is concave). */
function gridMaximum(points: readonly DosePoint[]): { a: number; b: number } {
  let centreA = 0;
  let centreB = 0;
  let half = 6;
  for (let round = 0; round < 40; round++) {
    let best = { a: centreA, b: centreB, ll: Number.NEGATIVE_INFINITY };
    for (let i = -10; i <= 10; i++) {
      for (let j = -10; j <= 10; j++) {
        const a = centreA + (i * half) / 10;
        const b = centreB + (j * half) / 10;
        const ll = logLik(points, a, b);
        if (ll > best.ll) best = { a, b, ll };
      }
    }
    centreA = best.a;
    centreB = best.b;
    half /= 2.5;
  }
  return { a: centreA, b: centreB };
}

const DECLINE: DosePoint[] = [
  { x: 0, successes: 96, trials: 100 },
  { x: 1, successes: 91, trials: 100 },
  { x: 2, successes: 80, trials: 100 },
  { x: 3, successes: 62, trials: 100 },
  { x: 4, successes: 35, trials: 100 },
];

describe('probitRegression', () => {
  it('when fitted, then the estimates match a direct search of the log-likelihood', () => {
    const fit = probitRegression(DECLINE);
    const brute = gridMaximum(DECLINE);
    expect(fit.converged).toBe(true);
    expect(fit.warning).toBeNull();
    expect(fit.intercept).toBeCloseTo(brute.a, 6);
    expect(fit.slope).toBeCloseTo(brute.b, 6);
    expect(fit.logLikelihood).toBeCloseTo(logLik(DECLINE, brute.a, brute.b), 8);
  });

  it('when fitted, then the covariance is the inverse expected information and the deviance is against the saturated model', () => {
    const fit = probitRegression(DECLINE);
    // Expected information for the probit GLM: Σ n φ(η)²/(Φ(η)Φ(−η)) · [1 x; x x²] (McCullagh & Nelder, GLM theory).
    let s0 = 0;
    let s1 = 0;
    let s2 = 0;
    for (const p of DECLINE) {
      const eta = fit.intercept + fit.slope * p.x;
      const w = (p.trials * jStat.normal.pdf(eta, 0, 1) ** 2) / (PHI(eta) * PHI(-eta));
      s0 += w;
      s1 += w * p.x;
      s2 += w * p.x * p.x;
    }
    const det = s0 * s2 - s1 * s1;
    expect(fit.covariance[0][0]).toBeCloseTo(s2 / det, 10);
    expect(fit.covariance[0][1]).toBeCloseTo(-s1 / det, 10);
    expect(fit.covariance[1][1]).toBeCloseTo(s0 / det, 10);
    expect(fit.seSlope).toBeCloseTo(Math.sqrt(s0 / det), 10);
    // Saturated log-likelihood uses the observed proportions (definition of the deviance).
    const saturated = DECLINE.reduce((s, p) => {
      const f = p.successes / p.trials;
      return s + p.successes * Math.log(f) + (p.trials - p.successes) * Math.log(1 - f);
    }, 0);
    expect(fit.deviance).toBeCloseTo(2 * (saturated - fit.logLikelihood), 8);
  });

  it('when the standard errors are compared with the observed information, then they agree closely', () => {
    // Finite-difference Hessian of the log-likelihood: for a well-fitting probit model observed and
    // expected information are close (they differ by a term proportional to the residuals).
    const fit = probitRegression(DECLINE);
    const h = 1e-4;
    const a = fit.intercept;
    const b = fit.slope;
    const ll = (da: number, db: number) => logLik(DECLINE, a + da, b + db);
    const haa = (ll(h, 0) - 2 * ll(0, 0) + ll(-h, 0)) / (h * h);
    const hbb = (ll(0, h) - 2 * ll(0, 0) + ll(0, -h)) / (h * h);
    const hab = (ll(h, h) - ll(h, -h) - ll(-h, h) + ll(-h, -h)) / (4 * h * h);
    const det = haa * hbb - hab * hab;
    expect(Math.sqrt(-haa / det) / fit.seSlope).toBeCloseTo(1, 1);
    expect(Math.sqrt(-hbb / det) / fit.seIntercept).toBeCloseTo(1, 1);
  });

  it('when there are 0% and 100% points that still overlap, then the fit converges to the likelihood maximum', () => {
    const points: DosePoint[] = [
      { x: 0, successes: 100, trials: 100 },
      { x: 2, successes: 90, trials: 100 },
      { x: 4, successes: 50, trials: 100 },
      { x: 6, successes: 0, trials: 100 },
    ];
    const fit = probitRegression(points);
    const brute = gridMaximum(points);
    expect(fit.converged).toBe(true);
    expect(fit.intercept).toBeCloseTo(brute.a, 5);
    expect(fit.slope).toBeCloseTo(brute.b, 5);
  });

  it('when the data are single seeds (0/1 outcomes), then the fit still matches the direct search', () => {
    const uniform = mulberry32(7);
    const points: DosePoint[] = Array.from({ length: 60 }, (_, i) => {
      const x = i / 10;
      return { x, successes: uniform() < PHI(1.5 - 0.5 * x) ? 1 : 0, trials: 1 };
    });
    const fit = probitRegression(points);
    const brute = gridMaximum(points);
    expect(fit.converged).toBe(true);
    expect(fit.intercept).toBeCloseTo(brute.a, 5);
    expect(fit.slope).toBeCloseTo(brute.b, 5);
  });

  it('when data are simulated from known Ki and σ, then the fit recovers them within a few standard errors', () => {
    // Seed viability equation v = Ki − p/σ (Ellis & Roberts 1980) with Ki = 2.0, σ = 3 years.
    const uniform = mulberry32(42);
    const points: DosePoint[] = Array.from({ length: 13 }, (_, i) => {
      const x = i / 2;
      return { x, successes: binomialDraw(500, PHI(2.0 - x / 3), uniform), trials: 500 };
    });
    const fit = probitRegression(points);
    expect(fit.converged).toBe(true);
    expect(Math.abs(fit.intercept - 2.0)).toBeLessThan(3.5 * fit.seIntercept);
    expect(Math.abs(fit.slope + 1 / 3)).toBeLessThan(3.5 * fit.seSlope);
    expect(-1 / fit.slope).toBeCloseTo(3, 0);
  });

  it('when many data sets are simulated, then about 95% of the Wald intervals cover the true slope', () => {
    const uniform = mulberry32(2024);
    const trueA = 1.8;
    const trueB = -0.4;
    const runs = 400;
    let covered = 0;
    for (let r = 0; r < runs; r++) {
      const points = [0, 1, 2, 3, 4].map((x) => ({
        x,
        successes: binomialDraw(100, PHI(trueA + trueB * x), uniform),
        trials: 100,
      }));
      const fit = probitRegression(points);
      if (Math.abs(fit.slope - trueB) <= 1.959964 * fit.seSlope) covered += 1;
    }
    // Nominal 0.95; binomial SD of the share over 400 runs ≈ 0.011.
    expect(covered / runs).toBeGreaterThan(0.92);
    expect(covered / runs).toBeLessThan(0.98);
  });

  it('when the data are separated, then convergence is reported as false with a reason', () => {
    // 100% then 95%: quasi-complete separation, the MLE lies at infinity (Albert & Anderson 1984 — from memory).
    const separated = probitRegression([
      { x: 0, successes: 100, trials: 100 },
      { x: 2, successes: 95, trials: 100 },
    ]);
    expect(separated.converged).toBe(false);
    expect(separated.warning).toMatch(/separated/);
    const allGerminated = probitRegression([
      { x: 0, successes: 50, trials: 50 },
      { x: 1, successes: 50, trials: 50 },
    ]);
    expect(allGerminated.converged).toBe(false);
    expect(allGerminated.warning).toMatch(/100%/);
  });

  it('when the points do not identify a slope or are nonsense, then it throws a RangeError', () => {
    expect(() =>
      probitRegression([
        { x: 1, successes: 5, trials: 10 },
        { x: 1, successes: 6, trials: 10 },
      ]),
    ).toThrow(RangeError);
    expect(() =>
      probitRegression([
        { x: 1, successes: 11, trials: 10 },
        { x: 2, successes: 6, trials: 10 },
      ]),
    ).toThrow(RangeError);
    expect(() =>
      probitRegression([
        { x: Number.NaN, successes: 1, trials: 10 },
        { x: 2, successes: 6, trials: 10 },
      ]),
    ).toThrow(RangeError);
  });
});

/** Profile maximisation written independently: ternary search on b, and for each b on every a_g. */
function profileMaximum(groups: readonly (readonly DosePoint[])[]): { intercepts: number[]; slope: number } {
  const ternary = (f: (v: number) => number, lo: number, hi: number): number => {
    let a = lo;
    let b = hi;
    for (let i = 0; i < 120; i++) {
      const m1 = a + (b - a) / 3;
      const m2 = b - (b - a) / 3;
      if (f(m1) < f(m2)) a = m1;
      else b = m2;
    }
    return (a + b) / 2;
  };
  const interceptsFor = (slope: number) => groups.map((g) => ternary((a) => logLik(g, a, slope), -10, 10));
  const total = (slope: number) =>
    interceptsFor(slope).reduce((s, a, i) => s + logLik(groups[i] ?? [], a, slope), 0);
  const slope = ternary(total, -5, 5);
  return { intercepts: interceptsFor(slope), slope };
}

describe('probitRegressionGroups', () => {
  const lots: DosePoint[][] = [
    [
      { x: 0, successes: 97, trials: 100 },
      { x: 2, successes: 88, trials: 100 },
      { x: 4, successes: 61, trials: 100 },
    ],
    [
      { x: 1, successes: 85, trials: 100 },
      { x: 3, successes: 63, trials: 100 },
    ],
    [{ x: 2, successes: 40, trials: 50 }],
  ];

  it('when lots share a slope, then the estimates match an independent profile-likelihood search', () => {
    const fit = probitRegressionGroups(lots.map((points) => ({ points })));
    const brute = profileMaximum(lots);
    expect(fit.converged).toBe(true);
    expect(fit.slope).toBeCloseTo(brute.slope, 6);
    fit.intercepts.forEach((a, i) => expect(a).toBeCloseTo(brute.intercepts[i] ?? Number.NaN, 5));
    expect(fit.covariance).toHaveLength(4);
    expect(fit.seIntercepts).toHaveLength(3);
    expect(fit.seSlope).toBeCloseTo(Math.sqrt(fit.covariance[3]?.[3] ?? Number.NaN), 12);
  });

  it('when a lot has a single test, then its intercept fits that test exactly (it carries no slope information)', () => {
    // One free parameter per lot: the ML fitted probability equals the observed 40/50 (GLM score equation).
    const fit = probitRegressionGroups(lots.map((points) => ({ points })));
    expect(PHI((fit.intercepts[2] ?? 0) + fit.slope * 2)).toBeCloseTo(0.8, 8);
  });

  it('when there is one group, then it agrees with the single-group regression', () => {
    const pooled = probitRegressionGroups([{ points: DECLINE }]);
    const single = probitRegression(DECLINE);
    expect(pooled.slope).toBeCloseTo(single.slope, 9);
    expect(pooled.intercepts[0]).toBeCloseTo(single.intercept, 9);
    expect(pooled.seSlope).toBeCloseTo(single.seSlope, 9);
  });

  it('when lots are simulated with a common σ, then the shared slope is recovered', () => {
    // Seed viability equation with σ = 2.5 years for all lots and Ki of 2.2, 1.6 and 1.0 probits.
    const uniform = mulberry32(99);
    const kis = [2.2, 1.6, 1.0];
    const groups = kis.map((ki) => ({
      points: [0, 1, 2, 3].map((x) => ({
        x,
        successes: binomialDraw(400, PHI(ki - x / 2.5), uniform),
        trials: 400,
      })),
    }));
    const fit = probitRegressionGroups(groups);
    expect(fit.converged).toBe(true);
    expect(Math.abs(fit.slope + 0.4)).toBeLessThan(3.5 * fit.seSlope);
    fit.intercepts.forEach((a, i) =>
      expect(Math.abs(a - (kis[i] ?? 0))).toBeLessThan(3.5 * (fit.seIntercepts[i] ?? 0)),
    );
  });

  it('when a lot is all 100%, then convergence is reported as false', () => {
    const fit = probitRegressionGroups([
      { points: lots[0] ?? [] },
      {
        points: [
          { x: 1, successes: 20, trials: 20 },
          { x: 2, successes: 20, trials: 20 },
        ],
      },
    ]);
    expect(fit.converged).toBe(false);
    expect(fit.warning).toMatch(/group 1/);
  });

  it('when no group spans two x values, then it throws a RangeError', () => {
    expect(() => probitRegressionGroups([{ points: [{ x: 1, successes: 5, trials: 10 }] }])).toThrow(
      RangeError,
    );
    expect(() => probitRegressionGroups([])).toThrow(RangeError);
  });
});
