import { logGamma } from './distributions';
import { assertOpenUnit, assertPositiveCount } from './validate';

function logPmf(j: number, n: number, p: number): number {
  return logGamma(n + 1) - logGamma(j + 1) - logGamma(n - j + 1) + j * Math.log(p) + (n - j) * Math.log1p(-p);
}

/**
 * P(X ≥ k) for X ~ Binomial(n, p), summed exactly in floating point: the terms are generated from
 * the mode outwards by the ratio pmf(j+1)/pmf(j) = (n − j)/(j + 1) · p/(1 − p), scaled by the mode's
 * probability (from log-gamma), so nothing overflows for n in the thousands or millions. The
 * smaller tail is summed and the other obtained by complement.
 */
export function binomialUpperTail(k: number, n: number, p: number): number {
  if (k <= 0) return 1;
  if (k > n) return 0;
  if (p <= 0) return 0;
  if (p >= 1) return 1;
  const mode = Math.min(n, Math.floor((n + 1) * p));
  const modeProbability = Math.exp(logPmf(mode, n, p));
  const odds = p / (1 - p);
  const sumRange = (from: number, to: number): number => {
    // Walk away from the mode in each direction, so the terms only shrink.
    let total = 0;
    if (to >= mode) {
      let term = modeProbability;
      for (let j = mode; j <= to; j++) {
        if (j >= from) total += term;
        term *= ((n - j) / (j + 1)) * odds;
        if (term === 0) break;
      }
    }
    if (from < mode) {
      let term = modeProbability;
      for (let j = mode - 1; j >= from; j--) {
        term *= (j + 1) / (n - j) / odds;
        if (j <= to) total += term;
        if (term === 0) break;
      }
    }
    return total;
  };
  // Sum the side not containing the mode when possible: it is the smaller one.
  return k > mode ? Math.min(1, sumRange(k, n)) : Math.max(0, 1 - sumRange(0, k - 1));
}

/**
 * The least number of seeds n with P(Binomial(n, p) ≥ plants) ≥ assurance: sow that many and at
 * least `plants` seedlings come up with the chosen assurance. The tail grows with n, so the answer
 * is found by doubling and then bisection.
 */
export function seedsToSow(plants: number, germinationFraction: number, assurance = 0.9): number {
  assertPositiveCount(plants, 'plants');
  if (!Number.isFinite(germinationFraction) || germinationFraction <= 0 || germinationFraction > 1) {
    throw new RangeError(`germinationFraction must be above 0 and at most 1 (got ${String(germinationFraction)})`);
  }
  assertOpenUnit(assurance, 'assurance');
  const p = germinationFraction;
  const enough = (n: number) => binomialUpperTail(plants, n, p) >= assurance;
  if (enough(plants)) return plants;
  let low = plants; // not enough
  let high = Math.max(plants + 1, Math.ceil(plants / p));
  while (!enough(high)) {
    low = high;
    high *= 2;
    if (high > 1e9) throw new RangeError('the number of seeds needed is beyond a billion');
  }
  while (high - low > 1) {
    const mid = Math.floor((low + high) / 2);
    if (enough(mid)) high = mid;
    else low = mid;
  }
  return high;
}
