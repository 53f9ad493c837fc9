import { wilsonScoreInterval } from '#shared/wilson';
import { twoSidedZ } from './distributions';
import type { Interval } from './interval';
import { assertOpenUnit, assertSuccesses } from './validate';

/**
 * Wilson score interval for a binomial proportion (the formula is in shared/wilson.ts, which the
 * browser uses too), at any confidence level, with its arguments checked. It is the default for
 * germination percentages.
 */
export function wilsonInterval(successes: number, trials: number, confidence = 0.95): Interval {
  assertSuccesses(successes, trials);
  if (trials === 0) throw new RangeError('trials must be at least 1 for an interval');
  assertOpenUnit(confidence, 'confidence');
  return wilsonScoreInterval(successes, trials, twoSidedZ(confidence));
}
