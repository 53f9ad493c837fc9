// What a rough score of a tray, or the seedlings that came up from a real sowing, says about a lot's
// germination: no percentage, but a likelihood over the germination fraction p that the viability
// model can multiply in, weaker than a counted test's binomial likelihood.
import type { Interval } from './interval';
import { binomialUpperTail } from './seeds-to-sow';
import { assertCount, assertPositiveCount } from './validate';

export type RoughScore = 'none' | 'few' | 'half' | 'most';

/**
 * Our convention (no standard defines these words): the share of the seeds sown that came up, as
 * read from a rough score. The bands meet, so every count belongs to exactly one: a share s is in
 * [low, high), and 'most' includes 100%.
 */
export const ROUGH_SCORE_BANDS: Readonly<Record<RoughScore, Interval>> = {
  none: { low: 0, high: 0.05 },
  few: { low: 0.05, high: 0.35 },
  half: { low: 0.35, high: 0.65 },
  most: { low: 0.65, high: 1 },
};

/** The seedling counts, out of `sown`, that a score stands for: from `low` to `high`, inclusive. */
export function roughScoreCounts(score: RoughScore, sown: number): { low: number; high: number } {
  assertPositiveCount(sown, 'sown');
  const band = ROUGH_SCORE_BANDS[score];
  // The tolerance keeps 0.35 × 20 = 7.000000000000001 at 7.
  const first = (share: number) => Math.max(0, Math.ceil(share * sown - 1e-9));
  return { low: first(band.low), high: score === 'most' ? sown : first(band.high) - 1 };
}

/**
 * P(score | p): the chance that a tray of `sown` seeds, each germinating with chance p, shows a
 * share of seedlings inside the score's band (an interval-censored binomial count). It is a proper
 * likelihood in p, flat inside the band and falling away at its edges, so a score informs the
 * model without pretending to be a count. `sown` is the tray's (expected) number of seeds, rounded.
 */
export function roughScoreLikelihood(score: RoughScore, p: number, sown: number): number {
  if (!(p >= 0 && p <= 1)) throw new RangeError(`p must be from 0 to 1 (got ${String(p)})`);
  const n = Math.max(1, Math.round(sown));
  const { low, high } = roughScoreCounts(score, n);
  if (high < low) return 0; // a band narrower than one seed on a very small tray
  return Math.max(0, binomialUpperTail(low, n, p) - binomialUpperTail(high + 1, n, p));
}

/**
 * Our convention: the share of germinating seeds that also emerge as seedlings from a real sowing
 * (depth, crusting, drying, cold soil, damping-off) is unknown, somewhere from 60% to 100%, uniform.
 * Field emergence is lower than a laboratory germination test, which is run in optimal conditions:
 * in the field "some depression of germination is to be expected", more in some species than others
 * (Acta Horticulturae 83, paper 13), and labelled germination "often overestimates" field emergence
 * (doi:10.1007/978-1-4615-1783-2_7). The size of the drop depends on species and seedbed, so it is a
 * range, not a factor; the 60% floor is ours. See ../shared/REFERENCES.md.
 */
export const FIELD_ESTABLISHMENT: Readonly<Interval> = { low: 0.6, high: 1 };
const ESTABLISHMENT_POINTS = 16;

export type Emergence = { seedlings: number } | { score: RoughScore };

/**
 * log L(p) for what came up from a sowing of `sown` seeds: the chance of the seedlings (counted or
 * scored) when each seed makes a seedling with chance p·s, averaged over the establishment share s
 * (FIELD_ESTABLISHMENT, midpoint rule on 16 points). This is how field emergence is down-weighted:
 * many seedlings still say the lot germinates at least that well, but few seedlings say much less
 * (they may be the seedbed's fault), so the evidence is weaker than a test's, mostly one-sided.
 * Additive constants are dropped (they do not matter to a likelihood).
 */
export function emergenceLogLikelihood(emergence: Emergence, sown: number, p: number): number {
  if (!(p >= 0 && p <= 1)) throw new RangeError(`p must be from 0 to 1 (got ${String(p)})`);
  // A sowing holds at least the seedlings that came up from it.
  const counted = 'seedlings' in emergence ? emergence.seedlings : 0;
  assertCount(counted, 'seedlings');
  const n = Math.max(1, Math.round(sown), counted);
  const width = FIELD_ESTABLISHMENT.high - FIELD_ESTABLISHMENT.low;
  const terms: number[] = [];
  for (let i = 0; i < ESTABLISHMENT_POINTS; i++) {
    const s = FIELD_ESTABLISHMENT.low + ((i + 0.5) * width) / ESTABLISHMENT_POINTS;
    const q = p * s;
    if ('seedlings' in emergence) {
      const y = emergence.seedlings;
      terms.push((y > 0 ? y * Math.log(q) : 0) + (n - y > 0 ? (n - y) * Math.log1p(-q) : 0));
    } else {
      terms.push(Math.log(roughScoreLikelihood(emergence.score, q, n)));
    }
  }
  const top = Math.max(...terms);
  if (top === Number.NEGATIVE_INFINITY) return top;
  const sum = terms.reduce((acc, t) => acc + Math.exp(t - top), 0);
  return top + Math.log(sum / ESTABLISHMENT_POINTS);
}
