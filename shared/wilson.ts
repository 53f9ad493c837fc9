// The Wilson score interval, the one formula behind every germination interval Hilum shows: the
// server's test results (server/stats/wilson.ts adds its argument checks and any confidence level)
// and the browser's whiskers on the decline chart. Pure, so both sides import it.

/** Φ⁻¹(0.975): the two-sided 95% normal quantile. */
export const Z_95 = 1.959963984540054;

/**
 * The Wilson score interval for `successes` of `trials` at normal quantile `z` (Wilson 1927,
 * J. Am. Stat. Assoc. 22:209–212; recommended by Newcombe 1998, Stat. Med. 17:857–872), as
 * fractions 0–1. It stays inside 0–1 and behaves at 0%, 100% and the small counts of a home test,
 * where the plain ±z·√(p(1−p)/n) interval does not. No trials, no information: the whole 0–1.
 */
export function wilsonScoreInterval(
  successes: number,
  trials: number,
  z = Z_95,
): { low: number; high: number } {
  if (trials <= 0) return { low: 0, high: 1 };
  const n = trials;
  const p = successes / n;
  const z2 = z * z;
  const denominator = 1 + z2 / n;
  const centre = (p + z2 / (2 * n)) / denominator;
  const halfWidth = (z / denominator) * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n));
  // At x = 0 and x = n the bounds are exactly 0 and 1 algebraically; pin them against rounding.
  const low = successes === 0 ? 0 : Math.max(0, centre - halfWidth);
  const high = successes === n ? 1 : Math.min(1, centre + halfWidth);
  return { low, high };
}
