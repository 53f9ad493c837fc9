// How many seeds went into a tray or a sowing that was not counted: weighed (grams → seeds through
// the lot's own seed weight and cleanliness, or the species' typical seeds per gram) or guessed.
// Each estimate carries the spread of the true number around it, which germinationFromUncertainSown
// (uncertain-sown.ts) carries into the germination interval.
import { twoSidedZ } from './distributions';
import type { Interval } from './interval';
import { DEFAULT_SCALE_STEP_GRAMS, SEED_WEIGHT_RULES, logNormalRange } from './seed-weight';
import { assertFinite, assertOpenUnit, assertPositiveCount } from './validate';

export type SownGuess = 'pinch' | 'few-dozen' | 'hundreds';

/**
 * Our convention (not from any standard): the seeds a grower means by each rough guess, read as a
 * central 95% range of a log-normal. Wide on purpose: a pinch of petunia and a pinch of squash differ
 * a hundredfold, so a guess bounds the germination only loosely.
 */
export const SOWN_GUESS_RANGES: Readonly<Record<SownGuess, Interval>> = {
  pinch: { low: 5, high: 50 },
  'few-dozen': { low: 24, high: 72 },
  hundreds: { low: 150, high: 900 },
};

/**
 * Our convention: the relative SD of a species' typical seeds per gram as a guide to one lot. The
 * handbook ranges in ../shared/REFERENCES.md span about ±20% (tomato 280–420) to a factor of 3
 * (zinnia 70–210) around their middle, so 0.35 (95% within about ×0.5 to ×2) is wide but not absurd.
 */
export const SPECIES_SEEDS_PER_GRAM_CV = 0.35;

export type SownBy = 'count' | 'weight' | 'guess';
export type SeedWeightBasis = 'lot' | 'species';

export interface SownEstimate {
  by: SownBy;
  /** Whose seeds per gram turned grams into seeds (weight only). */
  basis: SeedWeightBasis | null;
  /** Expected number of seeds sown. */
  mean: number;
  /** SD of the true number sown around `mean` (0 when counted). */
  sd: number;
  /** Plausible range of the number sown at the chosen confidence. */
  range: Interval;
  /** No purity figure was given, so the material was taken as clean seed (chaff would mean fewer). */
  purityAssumed: boolean;
}

export function sownByCount(seeds: number): SownEstimate {
  assertPositiveCount(seeds, 'seeds');
  return {
    by: 'count',
    basis: null,
    mean: seeds,
    sd: 0,
    range: { low: seeds, high: seeds },
    purityAssumed: false,
  };
}

/** A log-normal's mean and SD from its central range at quantile z. */
function logNormalFromRange(range: Interval, z: number): { mean: number; sd: number } {
  const mu = (Math.log(range.low) + Math.log(range.high)) / 2;
  const s = (Math.log(range.high) - Math.log(range.low)) / (2 * z);
  const mean = Math.exp(mu + (s * s) / 2);
  return { mean, sd: mean * Math.sqrt(Math.expm1(s * s)) };
}

/** The seeds a rough guess stands for (SOWN_GUESS_RANGES, a convention). */
export function sownFromGuess(about: SownGuess): SownEstimate {
  const range = SOWN_GUESS_RANGES[about];
  const { mean, sd } = logNormalFromRange(range, twoSidedZ(0.95));
  return { by: 'guess', basis: null, mean, sd, range: { ...range }, purityAssumed: false };
}

export interface SeedWeightSources {
  /** The lot's own figure (seedWeightFromSamples): used whenever present. */
  lot?: { seedsPerGram: number; relativeSe: number; seedCv?: number } | null;
  /** The species' typical seeds per gram: the fallback, with SPECIES_SEEDS_PER_GRAM_CV. */
  species?: { seedsPerGram: number } | null;
  /** The lot's pure-seed fraction (purityFromSample); absent means the material is taken as clean. */
  purity?: { fraction: number; se: number } | null;
}

export interface GramsOptions {
  scaleStepGrams?: number;
  confidence?: number;
}

function assertPositive(value: number, name: string): void {
  if (!Number.isFinite(value) || value <= 0)
    throw new RangeError(`${name} must be above 0 (got ${String(value)})`);
}

/**
 * Seeds in `grams` of a lot's material: grams × purity × seeds per gram, with the lot's own seeds
 * per gram when present (basis 'lot'), else the species' typical figure (basis 'species'). The
 * variance of the true number N around the estimate μ adds, by the delta method,
 * - the relative variances of the factors: seeds per gram (the lot's relativeSe, or
 *   SPECIES_SEEDS_PER_GRAM_CV), purity (se/fraction) and the weighing (step²/12 ÷ grams²), and
 * - the count's own variation in a fixed weight of material: μ·c², c the CV of one seed's weight
 *   (the lot's, or the rules' limit read per seed), since a weight holds a varying number of seeds;
 *   and μ·(1 − π) for the pinch's own share of chaff (our model: chaff particles taken to weigh about
 *   as much as a seed, so the seeds in a pinch are a binomial share of its particles).
 * So Var(N − μ) = μ²·Σ(relative variances) + μ·(c² + 1 − π).
 */
export function seedsFromGrams(
  grams: number,
  sources: SeedWeightSources,
  options: GramsOptions = {},
): SownEstimate {
  assertPositive(grams, 'grams');
  const step = options.scaleStepGrams ?? DEFAULT_SCALE_STEP_GRAMS;
  assertFinite(step, 'scaleStepGrams');
  const confidence = options.confidence ?? 0.95;
  assertOpenUnit(confidence, 'confidence');
  const defaultSeedCv =
    (SEED_WEIGHT_RULES.cvLimit.other / 100) * Math.sqrt(SEED_WEIGHT_RULES.seedsPerReplicate);

  let basis: SeedWeightBasis;
  let seedsPerGram: number;
  let perGramCv: number;
  let seedCv = defaultSeedCv;
  if (sources.lot) {
    basis = 'lot';
    assertPositive(sources.lot.seedsPerGram, 'lot.seedsPerGram');
    seedsPerGram = sources.lot.seedsPerGram;
    perGramCv = sources.lot.relativeSe;
    if (sources.lot.seedCv !== undefined) seedCv = sources.lot.seedCv;
  } else if (sources.species) {
    basis = 'species';
    assertPositive(sources.species.seedsPerGram, 'species.seedsPerGram');
    seedsPerGram = sources.species.seedsPerGram;
    perGramCv = SPECIES_SEEDS_PER_GRAM_CV;
  } else {
    throw new RangeError(
      'grams cannot become seeds: neither the lot nor its species has a seeds-per-gram figure',
    );
  }
  assertFinite(perGramCv, 'relativeSe');
  const purity = sources.purity ?? null;
  if (purity) {
    assertPositive(purity.fraction, 'purity.fraction');
    if (purity.fraction > 1) throw new RangeError('purity.fraction must be at most 1');
    assertFinite(purity.se, 'purity.se');
  }
  const fraction = purity?.fraction ?? 1;
  const purityCv = purity ? purity.se / purity.fraction : 0;
  const mean = grams * fraction * seedsPerGram;
  const relativeVar = perGramCv ** 2 + purityCv ** 2 + (step * step) / 12 / (grams * grams);
  const variance = mean * mean * relativeVar + mean * (seedCv * seedCv + 1 - fraction);
  const sd = Math.sqrt(variance);
  return {
    by: 'weight',
    basis,
    mean,
    sd,
    range: logNormalRange(mean, sd / mean, twoSidedZ(confidence)),
    purityAssumed: purity === null,
  };
}
