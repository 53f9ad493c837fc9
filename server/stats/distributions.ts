// The distribution functions the statistics module relies on, in one place so they are easy to see.
//
// simple-statistics 7.12.1 was measured against a reference library before use: its `probit` (a
// closed-form erf-inverse approximation) is off by 1e-5 to 3e-3 relative for p from 1e-10 to ½, its
// `errorFunction` (a Chebyshev fit) by up to ~1e-7, and its `cumulativeStdNormalProbability` is a
// two-decimal lookup table (it returns 0.001 at z = −6.4). All are far too coarse for the probit
// regression, which works with probabilities down to 1e-10. It has no chi-square cdf (only a table
// of critical values, used in the tests) and no incomplete beta. So its `gammaln` (in
// special-functions.ts, accurate to about 1e-15) and its `sum` (homogeneity.ts) are used; the normal
// cdf and quantile are the published methods named below. The accuracy reached is checked in
// tests/unit/stats/distributions.test.ts.
import { inverseRegularizedBeta, regularizedGammaP, regularizedGammaQ } from './special-functions';

const SQRT_2PI = Math.sqrt(2 * Math.PI);

/**
 * Φ(x), the standard normal cdf, through the incomplete gamma function:
 * Φ(x) = ½ Q(½, x²/2) for x < 0 and ½ + ½ P(½, x²/2) for x ≥ 0, since erfc(t) = Q(½, t²)
 * (Abramowitz & Stegun 1964, 6.5.17 with 7.1.2; Numerical Recipes 3rd ed. §6.2.2). The lower tail is
 * evaluated by the continued fraction, so it keeps relative accuracy (about 1e-14) far out, down to
 * the underflow of double precision near x = −38.
 */
export function normalCdf(x: number): number {
  if (Number.isNaN(x)) return Number.NaN;
  const t = (x * x) / 2;
  return x < 0 ? 0.5 * regularizedGammaQ(0.5, t) : 0.5 + 0.5 * regularizedGammaP(0.5, t);
}

/** φ(x), the standard normal density. */
export function normalPdf(x: number): number {
  return Math.exp((-x * x) / 2) / SQRT_2PI;
}

// P. J. Acklam, "An algorithm for computing the inverse normal cumulative distribution function"
// (2003): rational approximations with relative error below 1.15e-9, for the central region
// 0.02425 ≤ p ≤ 0.97575 and for the tails.
const ACKLAM_A = [
  -3.969683028665376e1, 2.209460984245205e2, -2.759285104469687e2, 1.38357751867269e2, -3.066479806614716e1,
  2.506628277459239,
] as const;
const ACKLAM_B = [
  -5.447609879822406e1, 1.615858368580409e2, -1.556989798598866e2, 6.680131188771972e1, -1.328068155288572e1,
] as const;
const ACKLAM_C = [
  -7.784894002430293e-3, -3.223964580411365e-1, -2.400758277161838, -2.549732539343734, 4.374664141464968,
  2.938163982698783,
] as const;
const ACKLAM_D = [7.784695709041462e-3, 3.224671290700398e-1, 2.445134137142996, 3.754408661907416] as const;
const ACKLAM_LOW = 0.02425;

/** Acklam's approximation for 0 < p ≤ ½ (the lower half; the upper half follows by symmetry). */
function acklamLowerHalf(p: number): number {
  const [a0, a1, a2, a3, a4, a5] = ACKLAM_A;
  const [b0, b1, b2, b3, b4] = ACKLAM_B;
  const [c0, c1, c2, c3, c4, c5] = ACKLAM_C;
  const [d0, d1, d2, d3] = ACKLAM_D;
  if (p < ACKLAM_LOW) {
    const q = Math.sqrt(-2 * Math.log(p));
    return (
      (((((c0 * q + c1) * q + c2) * q + c3) * q + c4) * q + c5) /
      ((((d0 * q + d1) * q + d2) * q + d3) * q + 1)
    );
  }
  const q = p - 0.5;
  const r = q * q;
  return (
    ((((((a0 * r + a1) * r + a2) * r + a3) * r + a4) * r + a5) * q) /
    (((((b0 * r + b1) * r + b2) * r + b3) * r + b4) * r + 1)
  );
}

/** Φ⁻¹(p) for 0 < p ≤ ½: Acklam's value, refined by one Halley step on Φ as Acklam recommends. */
function lowerHalfQuantile(p: number): number {
  const x = acklamLowerHalf(p);
  // Halley's method for Φ(x) − p = 0: with u = (Φ(x) − p)/φ(x), x ← x − u/(1 + x u/2). One step
  // takes the 1e-9 approximation to the accuracy of Φ itself.
  const u = (normalCdf(x) - p) / normalPdf(x);
  return Number.isFinite(u) ? x - u / (1 + (x * u) / 2) : x;
}

/**
 * Φ⁻¹(p), the probit of p: −∞ at 0, +∞ at 1, NaN outside [0, 1]. For p above ½ it returns
 * −Φ⁻¹(1 − p) (1 − p is exact in floating point there), so both tails have relative accuracy.
 */
export function normalQuantile(p: number): number {
  if (!(p >= 0 && p <= 1)) return Number.NaN;
  if (p === 0) return Number.NEGATIVE_INFINITY;
  if (p === 1) return Number.POSITIVE_INFINITY;
  if (p === 0.5) return 0;
  return p < 0.5 ? lowerHalfQuantile(p) : -lowerHalfQuantile(1 - p);
}

/** The two-sided critical value z for a confidence level, e.g. 1.959964 for 0.95. */
export function twoSidedZ(confidence: number): number {
  return normalQuantile(1 - (1 - confidence) / 2);
}

/** The p-quantile of Beta(a, b) (inverse of the regularized incomplete beta; special-functions.ts). */
export function betaQuantile(p: number, a: number, b: number): number {
  return inverseRegularizedBeta(p, a, b);
}

/** P(χ²_df ≤ statistic) = P(df/2, statistic/2), the regularized lower incomplete gamma. */
export function chiSquareCdf(statistic: number, df: number): number {
  if (statistic <= 0) return 0;
  return regularizedGammaP(df / 2, statistic / 2);
}

/** P(χ²_df ≥ statistic) = Q(df/2, statistic/2), computed directly so small p-values keep their digits. */
export function chiSquareUpperTail(statistic: number, df: number): number {
  if (statistic <= 0) return 1;
  return Math.min(1, Math.max(0, regularizedGammaQ(df / 2, statistic / 2)));
}
