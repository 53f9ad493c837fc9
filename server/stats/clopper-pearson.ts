import { betaQuantile } from './distributions';
import type { Interval } from './interval';
import { assertOpenUnit, assertSuccesses } from './validate';

/**
 * Clopper–Pearson "exact" interval (Clopper & Pearson 1934): the bounds are the beta quantiles
 * B(α/2; x, n − x + 1) and B(1 − α/2; x + 1, n − x), i.e. the proportions at which the binomial
 * tail probabilities P(X ≥ x) and P(X ≤ x) equal α/2. Conservative: coverage is at least nominal.
 */
export function clopperPearsonInterval(successes: number, trials: number, confidence = 0.95): Interval {
  assertSuccesses(successes, trials);
  if (trials === 0) throw new RangeError('trials must be at least 1 for an interval');
  assertOpenUnit(confidence, 'confidence');
  const alpha = 1 - confidence;
  const x = successes;
  const n = trials;
  const low = x === 0 ? 0 : betaQuantile(alpha / 2, x, n - x + 1);
  const high = x === n ? 1 : betaQuantile(1 - alpha / 2, x + 1, n - x);
  return { low, high };
}
