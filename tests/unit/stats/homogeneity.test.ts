import jStat from 'jstat';
import { describe, expect, it } from 'vitest';
import { homogeneityChiSquare } from '#server/stats/index';

describe('homogeneityChiSquare', () => {
  it('when two trays are compared, then the statistic is the square of the pooled two-proportion z', () => {
    // Identity of the 2×2 Pearson chi-square (no continuity correction) with z² of the pooled test:
    // z = (0.90 − 0.80)/√(0.85·0.15·(1/100 + 1/100)); z² = 3.921569 (computed); p = 2(1 − Φ(|z|)) (jstat normal).
    const result = homogeneityChiSquare([
      { germinated: 90, sown: 100 },
      { germinated: 80, sown: 100 },
    ]);
    const z = 0.1 / Math.sqrt(0.85 * 0.15 * 0.02);
    expect(result.statistic).toBeCloseTo(z * z, 10);
    expect(result.statistic).toBeCloseTo(3.921569, 6);
    expect(result.df).toBe(1);
    expect(result.pValue).toBeCloseTo(2 * (1 - jStat.normal.cdf(z, 0, 1)), 8);
  });

  it('when four trays differ in size, then it matches the binomial dispersion form and jstat χ²', () => {
    // Independent form: Σ (xᵢ − nᵢp̄)² / (nᵢ p̄ (1 − p̄)), algebraically equal to Pearson's 2×k statistic;
    // upper tail from jstat's chi-square cdf.
    const trays = [
      { germinated: 88, sown: 100 },
      { germinated: 41, sown: 50 },
      { germinated: 95, sown: 100 },
      { germinated: 70, sown: 90 },
    ];
    const pbar = trays.reduce((s, t) => s + t.germinated, 0) / trays.reduce((s, t) => s + t.sown, 0);
    const dispersion = trays.reduce(
      (s, t) => s + (t.germinated - t.sown * pbar) ** 2 / (t.sown * pbar * (1 - pbar)),
      0,
    );
    const result = homogeneityChiSquare(trays);
    expect(result.statistic).toBeCloseTo(dispersion, 10);
    expect(result.df).toBe(3);
    expect(result.pValue).toBeCloseTo(1 - jStat.chisquare.cdf(dispersion, 3), 10);
  });

  it('when the trays agree exactly, then the statistic is 0 and the p-value 1', () => {
    // Observed equals expected in every cell (definition of the Pearson statistic).
    const result = homogeneityChiSquare([
      { germinated: 45, sown: 50 },
      { germinated: 90, sown: 100 },
    ]);
    expect(result.statistic).toBeCloseTo(0, 12);
    expect(result.pValue).toBeCloseTo(1, 12);
  });

  it('when every seed or no seed germinated, then it reports statistic 0 and p-value 1', () => {
    // A zero row of expected counts carries no evidence (Hilum's documented handling).
    expect(
      homogeneityChiSquare([
        { germinated: 100, sown: 100 },
        { germinated: 50, sown: 50 },
      ]),
    ).toEqual({ statistic: 0, df: 1, pValue: 1 });
    expect(
      homogeneityChiSquare([
        { germinated: 0, sown: 100 },
        { germinated: 0, sown: 100 },
        { germinated: 0, sown: 25 },
      ]),
    ).toEqual({
      statistic: 0,
      df: 2,
      pValue: 1,
    });
    expect(homogeneityChiSquare([{ germinated: 30, sown: 100 }])).toEqual({ statistic: 0, df: 0, pValue: 1 });
  });

  it('when a tray is nonsense, then it throws a RangeError', () => {
    expect(() => homogeneityChiSquare([])).toThrow(RangeError);
    expect(() => homogeneityChiSquare([{ germinated: 101, sown: 100 }])).toThrow(RangeError);
    expect(() => homogeneityChiSquare([{ germinated: 0, sown: 0 }])).toThrow(RangeError);
    expect(() => homogeneityChiSquare([{ germinated: -2, sown: 10 }])).toThrow(RangeError);
  });
});
