import { assertOpenUnit, assertPositiveCount } from './validate';

/**
 * P(X ≥ k) for X ~ Binomial(n, p). The probabilities are generated from the mode outwards by the
 * ratio pmf(j+1)/pmf(j) = (n − j)/(j + 1) · p/(1 − p), relative to the mode's term (taken as 1),
 * until the terms no longer matter; the tail is then the share of the total. No factorials or
 * log-gamma approximations are involved, nothing overflows for n in the thousands or millions, and
 * the smaller side is returned directly (the larger by complement) to keep its precision.
 */
export function binomialUpperTail(k: number, n: number, p: number): number {
  if (k <= 0) return 1;
  if (k > n) return 0;
  if (p <= 0) return 0;
  if (p >= 1) return 1;
  const mode = Math.min(n, Math.floor((n + 1) * p));
  const odds = p / (1 - p);
  const negligible = 1e-20;
  let below = 0; // Σ over j < k
  let atOrAbove = 0; // Σ over j ≥ k
  let term = 1;
  for (let j = mode; j <= n; j++) {
    if (j >= k) atOrAbove += term;
    else below += term;
    term *= ((n - j) / (j + 1)) * odds;
    if (term < negligible * (below + atOrAbove)) break;
  }
  term = 1;
  for (let j = mode - 1; j >= 0; j--) {
    term *= (j + 1) / (n - j) / odds;
    if (j >= k) atOrAbove += term;
    else below += term;
    if (term < negligible * (below + atOrAbove)) break;
  }
  const total = below + atOrAbove;
  return k > mode ? atOrAbove / total : 1 - below / total;
}

/**
 * The least number of seeds n with P(Binomial(n, p) ≥ plants) ≥ assurance: sow that many and at
 * least `plants` seedlings come up with the chosen assurance. The tail grows with n, so the answer
 * is found by doubling and then bisection.
 */
export function seedsToSow(plants: number, germinationFraction: number, assurance = 0.9): number {
  assertPositiveCount(plants, 'plants');
  if (!Number.isFinite(germinationFraction) || germinationFraction <= 0 || germinationFraction > 1) {
    throw new RangeError(
      `germinationFraction must be above 0 and at most 1 (got ${String(germinationFraction)})`,
    );
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
