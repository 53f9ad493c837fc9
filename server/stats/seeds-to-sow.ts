import { assertCount, assertOpenUnit, assertPositiveCount } from './validate';

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
 * The least n ≥ plants, up to maxSeeds, for which `enough(n)` holds, given that `enough` only ever
 * turns from false to true as n grows (every tail used here grows with n; below `plants` seeds it
 * is false). Gallops away from `guess` in steps 1, 2, 4, … until the answer is bracketed, then
 * bisects: about 2·log₂|answer − guess| evaluations, so a close guess makes it cheap; never a scan
 * over every n. Returns null when even maxSeeds is not enough.
 */
function leastSufficientSeeds(
  plants: number,
  guess: number,
  enough: (n: number) => boolean,
  maxSeeds: number,
): number | null {
  if (plants > maxSeeds) return null;
  const start = Number.isFinite(guess) ? Math.min(maxSeeds, Math.max(plants, Math.ceil(guess))) : maxSeeds;
  let low: number; // not enough (plants − 1 stands for "fewer seeds than plants")
  let high: number; // enough
  if (enough(start)) {
    high = start;
    low = plants - 1;
    for (let step = 1; high - step >= plants; step *= 2) {
      if (!enough(high - step)) {
        low = high - step;
        break;
      }
      high -= step;
    }
  } else {
    low = start;
    for (let step = 1; ; step *= 2) {
      if (low >= maxSeeds) return null;
      const next = Math.min(maxSeeds, low + step);
      if (enough(next)) {
        high = next;
        break;
      }
      low = next;
    }
  }
  while (high - low > 1) {
    const mid = Math.floor((low + high) / 2);
    if (enough(mid)) high = mid;
    else low = mid;
  }
  return high;
}

/**
 * The least number of seeds n with P(Binomial(n, p) ≥ plants) ≥ assurance: sow that many and at
 * least `plants` seedlings come up with the chosen assurance. The tail grows with n, so the answer
 * is found by doubling and then bisection. This treats p as known exactly; when p is an estimate
 * from a test, the assurance is overstated (use seedsToSowPredictive or seedsToSowBetaBinomial).
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
  const seeds = leastSufficientSeeds(
    plants,
    plants / p,
    (n) => binomialUpperTail(plants, n, p) >= assurance,
    1e9,
  );
  if (seeds === null) throw new RangeError('the number of seeds needed is beyond a billion');
  return seeds;
}

/** One point of a posterior distribution for the per-seed chance of making a plant. */
export interface GerminationDraw {
  /** Probability that one sown seed makes a plant, 0 to 1. */
  p: number;
  /** Weight of this draw; the weights of a distribution sum to 1. */
  w: number;
}

function assertMaxSeeds(maxSeeds: number): void {
  assertPositiveCount(maxSeeds, 'maxSeeds');
}

/**
 * The least number of seeds n with Σ w·P(Binomial(n, p) ≥ plants) ≥ assurance, where the draws
 * (p, w) are the posterior distribution of the per-seed chance of making a plant (the caller has
 * already multiplied germination by establishment; the weights sum to 1). This is the posterior
 * predictive chance of at least `plants` seedlings, so the stated assurance holds over the
 * uncertainty in p, not only at a point estimate of it: a small test asks for more seed than a
 * large one with the same percentage.
 *
 * Returns null when no n ≤ maxSeeds reaches the assurance. That happens when much of the
 * distribution lies at or near p = 0 (a lot that is probably dead): weight at p = 0 never makes a
 * plant however much is sown, so if more than 1 − assurance of the weight sits there, no n is
 * enough, and weight just above 0 can push the answer past any sensible amount of seed.
 *
 * Cost: the mixture tail grows with n, so n is found by galloping and bisection, never by a scan
 * over every n. With more than 48 draws, a coarse mixture of 24 groups finds the answer first and
 * the full mixture is then evaluated only around it (usually two or three times). Each evaluation
 * runs over the draws from the lowest p up and stops as soon as the sum is sure to reach the
 * assurance or sure to miss it (the tail grows with p, which bounds the draws not yet visited);
 * each binomial tail costs O(√n).
 */
export function seedsToSowPredictive(
  plants: number,
  draws: readonly GerminationDraw[],
  assurance: number,
  maxSeeds = 100_000,
): number | null {
  assertPositiveCount(plants, 'plants');
  assertOpenUnit(assurance, 'assurance');
  assertMaxSeeds(maxSeeds);
  if (draws.length === 0) throw new RangeError('draws must hold at least one (p, w) pair');
  let total = 0;
  for (const { p, w } of draws) {
    if (!Number.isFinite(p) || p < 0 || p > 1) {
      throw new RangeError(`every draw's p must be from 0 to 1 (got ${String(p)})`);
    }
    if (!Number.isFinite(w) || w < 0) {
      throw new RangeError(`every draw's weight must be a finite number ≥ 0 (got ${String(w)})`);
    }
    total += w;
  }
  if (Math.abs(total - 1) > 1e-6) {
    throw new RangeError(`the draws' weights must sum to 1 (got ${String(total)})`);
  }
  // Lowest p first (see predictiveSearch); weights are rescaled by their sum so rounding in the
  // caller's weights does not move the answer.
  const live = draws
    .filter((d) => d.p > 0 && d.w > 0)
    .map((d) => ({ p: d.p, w: d.w / total }))
    .sort((x, y) => x.p - y.p);
  let reachable = 0; // the tail's limit as n grows: the weight with p > 0
  for (const d of live) reachable += d.w;
  if (reachable < assurance) return null;
  return predictiveSearch(plants, live, reachable, assurance, maxSeeds);
}

/** Above this many draws, a coarse mixture of this many groups first finds where to look. */
const COARSE_GROUPS = 24;

/**
 * seedsToSowPredictive on validated draws with p > 0, sorted by p from low to high, whose weights
 * add up to `reachable`. With many draws, the answer for a coarse mixture (neighbouring draws
 * merged into groups of about equal weight at their mean p) is found first; it is usually within a
 * seed or two of the full answer, so the full mixture is then evaluated only a few times around it.
 */
function predictiveSearch(
  plants: number,
  live: readonly GerminationDraw[],
  reachable: number,
  assurance: number,
  maxSeeds: number,
): number | null {
  // The draws still to come have higher p, so each of their tails is at least this draw's tail t
  // and at most 1: the sum is bracketed by sum + rest·t and sum + rest, and stops when decided.
  const enough = (n: number): boolean => {
    let sum = 0;
    let rest = reachable;
    for (const { p, w } of live) {
      rest -= w;
      const t = binomialUpperTail(plants, n, p);
      sum += w * t;
      if (sum + rest < assurance) return false;
      if (sum + rest * t >= assurance) return true;
    }
    return sum >= assurance;
  };
  let guess: number;
  if (live.length > 2 * COARSE_GROUPS) {
    const groups: GerminationDraw[] = [];
    let w = 0;
    let pw = 0;
    for (const d of live) {
      w += d.w;
      pw += d.p * d.w;
      if (w >= reachable / COARSE_GROUPS) {
        groups.push({ p: pw / w, w });
        w = 0;
        pw = 0;
      }
    }
    if (w > 0) groups.push({ p: pw / w, w });
    let grouped = 0; // the same total as `reachable` up to rounding; summed again for consistency
    for (const g of groups) grouped += g.w;
    guess = predictiveSearch(plants, groups, grouped, assurance, maxSeeds) ?? maxSeeds;
  } else {
    let mean = 0;
    for (const d of live) mean += d.p * d.w;
    guess = (plants * reachable) / mean;
  }
  return leastSufficientSeeds(plants, guess, enough, maxSeeds);
}

function assertBetaShape(a: number, b: number): void {
  if (!Number.isFinite(a) || a <= 0) throw new RangeError(`a must be a positive number (got ${String(a)})`);
  if (!Number.isFinite(b) || b <= 0) throw new RangeError(`b must be a positive number (got ${String(b)})`);
}

/**
 * P(X ≥ k) for X ~ BetaBinomial(n, a, b): the number of plants from n seeds when the per-seed
 * chance is itself uncertain, distributed Beta(a, b). Exact: the probabilities
 * P(X = j) = C(n, j) B(j + a, n − j + b) / B(a, b) are generated from j = 0 by the ratio
 * P(X = j + 1)/P(X = j) = (n − j)(j + a) / ((j + 1)(n − j − 1 + b)), kept as logarithms with a
 * running maximum (so nothing overflows or underflows for n in the hundreds of thousands), and the
 * tail is their share of the total; the smaller side is returned directly, the larger by
 * complement. Every term is visited (O(n)), because for a < 1 or b < 1 the probabilities need not
 * fall away from a single peak.
 */
export function betaBinomialUpperTail(k: number, n: number, a: number, b: number): number {
  assertCount(n, 'n');
  assertBetaShape(a, b);
  if (!Number.isInteger(k)) throw new RangeError(`k must be a whole number (got ${String(k)})`);
  if (k <= 0) return 1;
  if (k > n) return 0;
  let logTerm = 0; // ln(P(X = j)/P(X = 0))
  let peak = 0; // the largest logTerm so far; the sums below are scaled by e^(−peak)
  let below = 1; // Σ over j < k, starting with j = 0
  let atOrAbove = 0; // Σ over j ≥ k
  for (let j = 0; j < n; j++) {
    logTerm += Math.log(((n - j) * (j + a)) / ((j + 1) * (n - j - 1 + b)));
    if (logTerm > peak) {
      const scale = Math.exp(peak - logTerm);
      below *= scale;
      atOrAbove *= scale;
      peak = logTerm;
    }
    const term = Math.exp(logTerm - peak);
    if (j + 1 >= k) atOrAbove += term;
    else below += term;
  }
  const sum = below + atOrAbove;
  return atOrAbove <= below ? atOrAbove / sum : 1 - below / sum;
}

/**
 * The least number of seeds n with P(BetaBinomial(n, a, b) ≥ plants) ≥ assurance: seeds to sow
 * when the per-seed chance of making a plant has a Beta(a, b) posterior. A test in which x of m
 * seeds germinated gives Beta(x + ½, m − x + ½) under the Jeffreys prior, or Beta(x + 1, m − x + 1)
 * under the uniform prior (multiply by an establishment factor elsewhere: scaling p is not a beta
 * posterior, so use seedsToSowPredictive with draws for that). Returns null when no n ≤ maxSeeds
 * reaches the assurance, which happens when most of the posterior lies near p = 0 (for instance
 * a test with no seed germinated).
 */
export function seedsToSowBetaBinomial(
  plants: number,
  a: number,
  b: number,
  assurance: number,
  maxSeeds = 100_000,
): number | null {
  assertPositiveCount(plants, 'plants');
  assertBetaShape(a, b);
  assertOpenUnit(assurance, 'assurance');
  assertMaxSeeds(maxSeeds);
  return leastSufficientSeeds(
    plants,
    (plants * (a + b)) / a,
    (n) => betaBinomialUpperTail(plants, n, a, b) >= assurance,
    maxSeeds,
  );
}
