import { twoSidedZ } from './distributions';
import type { Interval } from './interval';
import { assertOpenUnit, assertSuccesses } from './validate';

/**
 * Wilson score interval for a binomial proportion (Wilson 1927; recommended by Newcombe 1998,
 * Stat. Med. 17:857–872). It stays inside 0–1 and behaves at 0%, 100% and small counts, which is
 * why it is the default for germination percentages.
 */
export function wilsonInterval(successes: number, trials: number, confidence = 0.95): Interval {
  assertSuccesses(successes, trials);
  if (trials === 0) throw new RangeError('trials must be at least 1 for an interval');
  assertOpenUnit(confidence, 'confidence');
  const z = twoSidedZ(confidence);
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
