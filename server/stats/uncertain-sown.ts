// Germination of a tray whose number of seeds sown is itself uncertain (sown by weight or by a
// rough guess): an estimate and an interval that carry both the binomial chance of germination and
// the uncertainty of the number sown.
//
// Method (a score interval with the variance widened by the delta method / law of total variance):
// with N seeds sown, the seedlings X ~ Binomial(N, p), and N unknown with mean μ and SD τ,
//   E[X] = μp,  Var[X] = E[Var(X | N)] + Var(E[X | N]) = μp(1 − p) + τ²p².
// The interval is every p the normal approximation does not reject at the chosen level:
//   (x − μp)² ≤ z²(μp(1 − p) + τ²p²),
// a quadratic inequality in p, solved in closed form. With τ = 0 it is exactly Wilson's score
// interval (Wilson 1927), the project's default, and the function then returns wilsonInterval
// itself; the τ²p² term is what widens it. When τ is a large share of μ (τ/μ ≳ 1/z) the quadratic
// opens downward and the set has no upper end inside 0–1: the interval then honestly runs to 100%.
// Checked by seeded simulation in tests/unit/stats/uncertain-sown.test.ts.
import { twoSidedZ } from './distributions';
import type { Interval } from './interval';
import { assertCount, assertFinite, assertOpenUnit } from './validate';
import { wilsonInterval } from './wilson';

export interface UncertainSown {
  /** Expected number of seeds sown. */
  mean: number;
  /** SD of the true number sown around `mean` (0 when counted). */
  sd: number;
}

export type UncertainSownGermination =
  | {
      kind: 'estimate';
      /** Seedlings ÷ expected seeds sown, at most 1. */
      fraction: number;
      interval: Interval;
      /** More seedlings than the expected number sown (but within its uncertainty): shown as 100%. */
      capped: boolean;
      /** The number sown was estimated, so the interval includes its uncertainty. */
      seedsSownEstimated: boolean;
    }
  | {
      kind: 'more-seedlings-than-sown';
      /** The most seeds the estimate makes plausible at this confidence (μ + zτ). */
      plausibleMaxSown: number;
      seedsSownEstimated: boolean;
    };

/**
 * Germination fraction and interval for `seedlings` counted from a tray whose seeds sown are
 * uncertain (see the method above). When even the most seeds the estimate makes plausible
 * (μ + zτ) are fewer than the seedlings, no percentage is given: the result says so
 * ('more-seedlings-than-sown') instead of showing more than 100%.
 */
export function germinationFromUncertainSown(
  seedlings: number,
  sown: UncertainSown,
  confidence = 0.95,
): UncertainSownGermination {
  assertCount(seedlings, 'seedlings');
  assertFinite(sown.mean, 'sown.mean');
  assertFinite(sown.sd, 'sown.sd');
  if (sown.mean <= 0) throw new RangeError(`sown.mean must be above 0 (got ${String(sown.mean)})`);
  if (sown.sd < 0) throw new RangeError(`sown.sd must be ≥ 0 (got ${String(sown.sd)})`);
  assertOpenUnit(confidence, 'confidence');
  const z = twoSidedZ(confidence);
  const x = seedlings;
  const mu = sown.mean;
  const tau = sown.sd;
  const estimated = tau > 0;

  if (x > mu + z * tau) {
    return {
      kind: 'more-seedlings-than-sown',
      plausibleMaxSown: mu + z * tau,
      seedsSownEstimated: estimated,
    };
  }
  if (!estimated && Number.isInteger(mu)) {
    return {
      kind: 'estimate',
      fraction: x / mu,
      interval: wilsonInterval(x, mu, confidence),
      capped: false,
      seedsSownEstimated: false,
    };
  }

  // f(p) = A p² − B p + C ≤ 0, with f(0) = x² ≥ 0 and f(1) ≤ 0 (checked above).
  const z2 = z * z;
  const a = mu * mu + z2 * mu - z2 * tau * tau;
  const b = 2 * x * mu + z2 * mu;
  const c = x * x;
  const f = (p: number) => (a * p - b) * p + c;
  let low: number;
  let high: number;
  if (x === 0) {
    low = 0;
  } else if (a === 0) {
    low = c / b;
  } else {
    // The smaller positive root, in the form that keeps its digits when A is near 0 or negative.
    const disc = Math.max(0, b * b - 4 * a * c);
    low = (2 * c) / (b + Math.sqrt(disc));
  }
  if (a > 0) {
    const disc = Math.max(0, b * b - 4 * a * c);
    high = Math.min(1, (b + Math.sqrt(disc)) / (2 * a));
  } else {
    high = 1; // the set has no upper end: every p from `low` up fits
  }
  if (f(1) <= 0) high = 1;
  low = Math.min(Math.max(0, low), high);
  const raw = x / mu;
  return {
    kind: 'estimate',
    fraction: Math.min(1, raw),
    interval: { low, high },
    capped: raw > 1,
    seedsSownEstimated: estimated,
  };
}
