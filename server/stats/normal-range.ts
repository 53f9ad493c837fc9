import { normalCdf, normalPdf } from './distributions';
import { assertOpenUnit } from './validate';

// Simpson's rule over ±9 standard deviations: the integrand's mass outside is below 1e-18.
const LOWER = -9;
const UPPER = 9;
const INTERVALS = 1800;

/**
 * P(W ≤ w) for the range W of k independent standard normal variables:
 * F(w) = k ∫ φ(x) [Φ(x + w) − Φ(x)]^(k−1) dx (the classical range distribution; e.g. Hartley 1942),
 * integrated numerically with Simpson's rule.
 */
export function normalRangeCdf(w: number, k: number): number {
  if (!Number.isInteger(k) || k < 2) throw new RangeError(`k must be a whole number ≥ 2 (got ${String(k)})`);
  if (!(w > 0)) return 0;
  const h = (UPPER - LOWER) / INTERVALS;
  let sum = 0;
  for (let i = 0; i <= INTERVALS; i++) {
    const x = LOWER + i * h;
    const weight = i === 0 || i === INTERVALS ? 1 : i % 2 === 1 ? 4 : 2;
    sum += weight * normalPdf(x) * (normalCdf(x + w) - normalCdf(x)) ** (k - 1);
  }
  return Math.min(1, (k * sum * h) / 3);
}

const quantileCache = new Map<string, number>();

/**
 * The quantile q with P(W ≤ q) = probability for the range of k standard normals (the
 * studentized range with infinite degrees of freedom), found by bisection on normalRangeCdf.
 * For k = 4 and probability 0.975 this is about 3.98, the factor behind the seed-testing tolerance
 * tables (Miles 1963, as described by da Silva 2020, Seed Sci. Res. 30:59–63).
 */
export function normalRangeQuantile(k: number, probability: number): number {
  assertOpenUnit(probability, 'probability');
  const key = `${String(k)}:${String(probability)}`;
  const cached = quantileCache.get(key);
  if (cached !== undefined) return cached;
  let low = 0;
  let high = 2;
  while (normalRangeCdf(high, k) < probability) high *= 2;
  for (let i = 0; i < 60 && high - low > 1e-12; i++) {
    const mid = (low + high) / 2;
    if (normalRangeCdf(mid, k) < probability) low = mid;
    else high = mid;
  }
  const q = (low + high) / 2;
  quantileCache.set(key, q);
  return q;
}
