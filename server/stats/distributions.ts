// The one place the statistics module touches jstat, so the distribution functions it relies on are
// easy to see (and to swap). jstat's normal cdf comes from its erfc, which loses relative accuracy
// beyond about 6 standard deviations; callers that go that far clamp probabilities themselves.
import jStat from 'jstat';

export function normalCdf(x: number): number {
  return jStat.normal.cdf(x, 0, 1);
}

export function normalPdf(x: number): number {
  return jStat.normal.pdf(x, 0, 1);
}

/** Φ⁻¹(p), the probit of p. */
export function normalQuantile(p: number): number {
  return jStat.normal.inv(p, 0, 1);
}

/** The two-sided critical value z for a confidence level, e.g. 1.959964 for 0.95. */
export function twoSidedZ(confidence: number): number {
  return normalQuantile(1 - (1 - confidence) / 2);
}

export function betaQuantile(p: number, a: number, b: number): number {
  return jStat.beta.inv(p, a, b);
}

/** P(χ²_df ≥ statistic). */
export function chiSquareUpperTail(statistic: number, df: number): number {
  if (statistic <= 0) return 1;
  return Math.min(1, Math.max(0, 1 - jStat.chisquare.cdf(statistic, df)));
}
