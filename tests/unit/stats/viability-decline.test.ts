import jStat from 'jstat';
import { describe, expect, it } from 'vitest';
import {
  fitViabilityDecline,
  probitRegression,
  probitRegressionGroups,
  projectViability,
  retestAge,
} from '#server/stats/index';
import type { ViabilityAssay } from '#server/stats/index';
import { mulberry32 } from './seeded-random';

// Test counts are illustrative; expected values come from the cited formula, an independent
// computation here, or simulation with known Ki and σ.

const PHI = (x: number) => jStat.normal.cdf(x, 0, 1);
const PROBIT = (p: number) => jStat.normal.inv(p, 0, 1);

function simulateLot(
  ki: number,
  sigma: number,
  ages: number[],
  sown: number,
  uniform: () => number,
): ViabilityAssay[] {
  return ages.map((ageYears) => {
    const p = PHI(ki - ageYears / sigma);
    let germinated = 0;
    for (let i = 0; i < sown; i++) if (uniform() < p) germinated += 1;
    return { ageYears, germinated, sown };
  });
}

const LOT: ViabilityAssay[] = [
  { ageYears: 0.5, germinated: 92, sown: 100 },
  { ageYears: 2, germinated: 85, sown: 100 },
  { ageYears: 3, germinated: 70, sown: 100 },
];

/** A fit with no uncertainty, for checking the formulas on their own. */
function exactFit(ki: number, sigma: number, lastAssayAgeYears = 0) {
  return {
    initialProbit: ki,
    slopePerYear: -1 / sigma,
    covariance: [
      [0, 0],
      [0, 0],
    ] as [[number, number], [number, number]],
    confidence: 0.95,
    lastAssayAgeYears,
  };
}

describe('seed viability equation facts', () => {
  it('when viability falls from 95% to 85%, then that is 0.608420 probits, i.e. 0.6084·σ', () => {
    // REFERENCES.md: 1.644854 − 1.036433 = 0.608420 probits (computed; Ellis & Roberts 1980 equation).
    expect(PROBIT(0.95) - PROBIT(0.85)).toBeCloseTo(0.60842, 6);
    const sigma = 2.5;
    const fit = exactFit(PROBIT(0.95), sigma);
    expect(projectViability(fit, 0.60842 * sigma).percent).toBeCloseTo(85, 4);
  });
});

describe('fitViabilityDecline', () => {
  it('when a lot has tests at several ages, then Ki and σ come from its own probit fit (basis lot)', () => {
    const fit = fitViabilityDecline(LOT);
    const direct = probitRegression(
      LOT.map((t) => ({ x: t.ageYears, successes: t.germinated, trials: t.sown })),
    ); // tested against a direct likelihood search
    expect(fit.basis).toBe('lot');
    expect(fit.initialProbit).toBeCloseTo(direct.intercept, 12);
    expect(fit.sigmaYears).toBeCloseTo(-1 / direct.slope, 12); // v = Ki − p/σ (Ellis & Roberts 1980)
    expect(fit.initialPercent).toBeCloseTo(100 * PHI(direct.intercept), 10);
    expect(fit.halfLifeYears).toBeCloseTo(fit.initialProbit * fit.sigmaYears, 12); // v = 0 at p = Ki·σ
    expect(projectViability(fit, fit.halfLifeYears).percent).toBeCloseTo(50, 8);
    expect(fit.notes).toEqual([]);
  });

  it('when tests are simulated from known Ki and σ, then the fit recovers them', () => {
    const uniform = mulberry32(5);
    const assays = simulateLot(1.9, 4, [0, 1, 2, 3, 4, 5, 6], 400, uniform);
    const fit = fitViabilityDecline(assays);
    const seKi = Math.sqrt(fit.covariance[0][0]);
    const seSlope = Math.sqrt(fit.covariance[1][1]);
    expect(Math.abs(fit.initialProbit - 1.9)).toBeLessThan(3.5 * seKi);
    expect(Math.abs(fit.slopePerYear + 0.25)).toBeLessThan(3.5 * seSlope);
  });

  it('when projected, then the interval is the delta method on the probit scale transformed by Φ', () => {
    const fit = fitViabilityDecline(LOT);
    const age = 4.5;
    const [[vaa, vab], [, vbb]] = fit.covariance;
    const eta = fit.initialProbit + fit.slopePerYear * age;
    const se = Math.sqrt(vaa + 2 * age * vab + age * age * vbb); // Var(a + b·t) (delta method)
    const z = PROBIT(0.975);
    const projected = projectViability(fit, age);
    expect(projected.percent).toBeCloseTo(100 * PHI(eta), 10);
    expect(projected.low).toBeCloseTo(100 * PHI(eta - z * se), 10);
    expect(projected.high).toBeCloseTo(100 * PHI(eta + z * se), 10);
    // Extrapolating further widens the probit-scale interval.
    const later = projectViability(fit, 8);
    expect(PROBIT(later.high / 100) - PROBIT(later.low / 100)).toBeGreaterThan(2 * z * se);
  });

  it('when a lot has one test and a typical storage life is known, then σ makes viability fall from the usual level to 50% over that life', () => {
    const fit = fitViabilityDecline([{ ageYears: 1, germinated: 90, sown: 100 }], {
      typicalLifeYears: 4,
      typicalInitialPercent: 90,
    });
    expect(fit.basis).toBe('typical');
    expect(fit.sigmaYears).toBeCloseTo(4 / PROBIT(0.9), 12); // Φ⁻¹(0.90) − 4/σ = 0 (Ellis & Roberts 1980 equation)
    // One test, one free parameter: the ML fit passes through the observed 90% (binomial score equation).
    expect(projectViability(fit, 1).percent).toBeCloseTo(90, 8);
    expect(fit.notes.join(' ')).toMatch(/typical storage life/);
  });

  it('when no typical initial level is given, then 85% is used (FAO Genebank Standards 2014, 4.3.2)', () => {
    const fit = fitViabilityDecline([{ ageYears: 0, germinated: 95, sown: 100 }], { typicalLifeYears: 5 });
    expect(fit.sigmaYears).toBeCloseTo(5 / PROBIT(0.85), 12);
  });

  it("when a lot has one test and the species' other lots were tested, then σ is borrowed from their pooled fit", () => {
    const otherLots: ViabilityAssay[][] = [
      [
        { ageYears: 0, germinated: 95, sown: 100 },
        { ageYears: 3, germinated: 60, sown: 100 },
      ],
      [
        { ageYears: 1, germinated: 88, sown: 100 },
        { ageYears: 4, germinated: 40, sown: 100 },
      ],
      [{ ageYears: 2, germinated: 100, sown: 100 }], // one age only: no slope information, left out
    ];
    const fit = fitViabilityDecline([{ ageYears: 1, germinated: 90, sown: 100 }], {
      otherLots,
      typicalLifeYears: 3,
    });
    const pooled = probitRegressionGroups(
      otherLots.slice(0, 2).map((lot) => ({
        points: lot.map((t) => ({ x: t.ageYears, successes: t.germinated, trials: t.sown })),
      })),
    );
    expect(fit.basis).toBe('species');
    expect(fit.slopePerYear).toBeCloseTo(pooled.slope, 12);
    expect(fit.covariance[1][1]).toBeCloseTo(pooled.seSlope ** 2, 12);
    expect(projectViability(fit, 1).percent).toBeCloseTo(90, 8); // passes through the lot's own test
    // Delta method with a borrowed slope: Var(Ki + b·t) = Var(Ki | b) + (t − t̄)²·Var(b), smallest at the tested age.
    const atAssay = projectViability(fit, 1);
    const later = projectViability(fit, 3);
    expect(PROBIT(later.high / 100) - PROBIT(later.low / 100)).toBeGreaterThan(
      PROBIT(atAssay.high / 100) - PROBIT(atAssay.low / 100),
    );
  });

  it('when a species slope is given instead of lots, then it is used with its standard error', () => {
    const fit = fitViabilityDecline([{ ageYears: 2, germinated: 80, sown: 100 }], {
      speciesSlope: { slope: -0.3, slopeSe: 0.05 },
    });
    expect(fit.basis).toBe('species');
    expect(fit.slopePerYear).toBe(-0.3);
    expect(fit.covariance[1][1]).toBeCloseTo(0.0025, 15);
    expect(projectViability(fit, 2).percent).toBeCloseTo(80, 8);
  });

  it("when the lot's tests show no decline, then the fit falls back to the prior and says so", () => {
    const rising: ViabilityAssay[] = [
      { ageYears: 0, germinated: 80, sown: 100 },
      { ageYears: 2, germinated: 88, sown: 100 },
    ];
    const fit = fitViabilityDecline(rising, { typicalLifeYears: 4 });
    expect(fit.basis).toBe('typical');
    expect(fit.slopePerYear).toBeLessThan(0);
    expect(fit.notes.join(' ')).toMatch(/no decline/);
  });

  it("when the lot's tests are separated (100% then 95%), then the fit falls back and says why", () => {
    const fit = fitViabilityDecline(
      [
        { ageYears: 0, germinated: 100, sown: 100 },
        { ageYears: 2, germinated: 95, sown: 100 },
      ],
      { speciesSlope: { slope: -0.4, slopeSe: 0.1 } },
    );
    expect(fit.basis).toBe('species');
    expect(fit.notes.join(' ')).toMatch(/no finite decline estimate/);
    expect(Number.isFinite(fit.initialProbit)).toBe(true);
  });

  it('when every test was 100%, then Ki uses the half-seed correction (x + ½)/(n + 1)', () => {
    // Empirical-probit correction (common practice): fitted viability at the test = 100.5/101.
    const fit = fitViabilityDecline([{ ageYears: 1, germinated: 100, sown: 100 }], { typicalLifeYears: 4 });
    expect(projectViability(fit, 1).percent).toBeCloseTo((100 * 100.5) / 101, 8);
    expect(fit.notes.join(' ')).toMatch(/half-seed/);
  });

  it('when nothing tells the rate of decline, then it throws a RangeError', () => {
    expect(() => fitViabilityDecline([{ ageYears: 1, germinated: 90, sown: 100 }])).toThrow(RangeError);
    expect(() => fitViabilityDecline([])).toThrow(RangeError);
    expect(() =>
      fitViabilityDecline([{ ageYears: -1, germinated: 90, sown: 100 }], { typicalLifeYears: 3 }),
    ).toThrow(RangeError);
    expect(() =>
      fitViabilityDecline([{ ageYears: 1, germinated: 120, sown: 100 }], { typicalLifeYears: 3 }),
    ).toThrow(RangeError);
  });
});

describe('retestAge', () => {
  it('when the lot declines fast, then retest comes at one third of the time to 85% of initial (FAO 2014, 4.3.3, from memory)', () => {
    // Ki = Φ⁻¹(0.95), σ = 1 year: 85% of 95% is 80.75%; T = (Φ⁻¹(0.95) − Φ⁻¹(0.8075))·1 (jstat normal).
    const fit = exactFit(PROBIT(0.95), 1, 0.5);
    const years = PROBIT(0.95) - PROBIT(0.8075);
    const retest = retestAge(fit);
    expect(retest.reason).toBe('monitoring-interval');
    expect(retest.ageYears).toBeCloseTo(0.5 + years / 3, 10);
  });

  it('when the lot declines slowly, then retest is capped at one year after the last test', () => {
    const retest = retestAge(exactFit(PROBIT(0.95), 20, 2));
    expect(retest).toEqual({ ageYears: 3, reason: 'one-year-cap' });
  });

  it('when a threshold is given, then retest comes where the projected lower bound reaches it', () => {
    const fit = fitViabilityDecline(
      [{ ageYears: 1, germinated: 90, sown: 100 }],
      { typicalLifeYears: 4 },
      { retestThresholdPercent: 80 },
    );
    expect(fit.retestReason).toBe('lower-bound');
    expect(projectViability(fit, fit.retestByAgeYears).low).toBeCloseTo(80, 6);
    expect(fit.retestByAgeYears).toBeGreaterThan(1);
    expect(fit.retestByAgeYears).toBeLessThan(2);
  });

  it('when the lower bound is already below the threshold at the last test, then retest is due at once', () => {
    const fit = fitViabilityDecline(LOT, {}, { retestThresholdPercent: 75 });
    expect(projectViability(fit, 3).low).toBeLessThan(75);
    expect(fit.retestByAgeYears).toBe(3);
    expect(fit.retestReason).toBe('lower-bound');
  });
});
