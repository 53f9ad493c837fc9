// A lot's own seed weight (seeds per gram) and cleanliness (pure-seed fraction) from weighed
// samples, with the uncertainty each carries. Downstream, sown-estimate.ts turns grams into seeds.
import { twoSidedZ } from './distributions';
import type { Interval } from './interval';
import { assertFinite, assertOpenUnit, assertPositiveCount } from './validate';

/**
 * The seed-testing rules' thousand-seed weight by replicates (ISTA Rules ch. 10; AOSA Rules
 * Appendix 4 in the same form): 8 replicates of 100 seeds, each weighed; the variance, standard
 * deviation and coefficient of variation of the replicate weights are computed and the result is
 * accepted when the CV is within the limit (4.0 for most seed, 6.0 for chaffy seed); otherwise a
 * further 8 replicates are weighed and any replicate more than 2 SD from the mean is discarded.
 * Sources and [memory] marks: ../shared/REFERENCES.md, "Seed weight and purity".
 */
export const SEED_WEIGHT_RULES = {
  replicates: 8,
  seedsPerReplicate: 100,
  /** CV limit (%) of 100-seed replicate weights. 4.0 read (secondary); 6.0 for chaffy seed [memory]. */
  cvLimit: { other: 4.0, chaffy: 6.0 },
} as const;

/**
 * Our convention: the smallest step of a home scale when the grower does not say, 0.01 g (a
 * pocket jewellery scale). The rounding error of one weighing is uniform, SD = step/√12.
 */
export const DEFAULT_SCALE_STEP_GRAMS = 0.01;

export interface WeighedSample {
  /** Seeds counted out. */
  seeds: number;
  /** Their weight in grams. */
  grams: number;
}

export interface SeedWeightOptions {
  /** Seed with chaff or appendages (the rules' "chaffy" seed): the looser CV limit applies. */
  chaffy?: boolean;
  /** Smallest step of the scale, grams (default DEFAULT_SCALE_STEP_GRAMS). */
  scaleStepGrams?: number;
  confidence?: number;
}

/** How the spread of the seeds-per-gram figure was found. */
export type SpreadBasis = 'replicates' | 'rules-limit';

export interface SeedWeight {
  seedsPerGram: number;
  /** Grams per 1000 seeds (the rules' thousand-seed weight). */
  thousandSeedWeight: number;
  sampleSeeds: number;
  sampleGrams: number;
  replicates: number;
  /**
   * CV (%) of the weight of a 100-seed replicate, from the samples (with unequal counts, each
   * sample's mean seed weight is weighted by its count, so 100-seed replicates give the rules' CV
   * exactly); null for a single sample.
   */
  replicateCv: number | null;
  cvLimit: number;
  /** 'single-sample' when no CV can be computed from the data. */
  cvCheck: 'within-limit' | 'above-limit' | 'single-sample';
  /** At least the rules' 8 replicates, each of at least 100 seeds. */
  rulesReplicates: boolean;
  /**
   * CV (fraction) of one seed's weight, used for the spread: from the replicates when there are at
   * least 8, otherwise the larger of that and the rules' limit read as a seed-to-seed CV (limit ×
   * √100): a sample that passes the rules varies at most that much, so it is a cautious default.
   */
  seedCv: number;
  spreadBasis: SpreadBasis;
  /** Relative standard error of seedsPerGram (seed-to-seed variation and the scale's rounding). */
  relativeSe: number;
  /** Plausible range of seedsPerGram at the chosen confidence (log-normal). */
  interval: Interval;
}

function scaleStep(options: { scaleStepGrams?: number }): number {
  const step = options.scaleStepGrams ?? DEFAULT_SCALE_STEP_GRAMS;
  assertFinite(step, 'scaleStepGrams');
  if (step < 0) throw new RangeError(`scaleStepGrams must be ≥ 0 (got ${String(step)})`);
  return step;
}

function assertGrams(grams: number, name: string): void {
  if (!Number.isFinite(grams) || grams <= 0) {
    throw new RangeError(`${name} must be a weight above 0 grams (got ${String(grams)})`);
  }
}

/** The rules' replicate statistics: sample variance, SD and CV (%) of replicate weights. */
export function replicateWeightStats(weights: readonly number[]): { mean: number; sd: number; cv: number } {
  if (weights.length < 2) throw new RangeError('at least two replicate weights are needed for a CV');
  weights.forEach((w, i) => assertGrams(w, `weights[${String(i)}]`));
  const n = weights.length;
  const mean = weights.reduce((s, w) => s + w, 0) / n;
  const variance = weights.reduce((s, w) => s + (w - mean) ** 2, 0) / (n - 1);
  const sd = Math.sqrt(variance);
  return { mean, sd, cv: (100 * sd) / mean };
}

/**
 * Seeds per gram of a lot from one or more weighed samples. The estimate is total seeds ÷ total
 * grams (every seed counts once whatever the sample sizes). Its spread combines the seed-to-seed
 * variation of weight (var of the mean seed weight = (seed CV)² / seeds counted) with the scale's
 * rounding in every weighing; with fewer than the rules' 8 replicates the seed CV is never taken
 * below the rules' limit (see SeedWeight.seedCv), so one sample states an honest, wide spread.
 */
export function seedWeightFromSamples(
  samples: readonly WeighedSample[],
  options: SeedWeightOptions = {},
): SeedWeight {
  if (samples.length === 0) throw new RangeError('at least one weighed sample is needed');
  samples.forEach((s, i) => {
    assertPositiveCount(s.seeds, `samples[${String(i)}].seeds`);
    assertGrams(s.grams, `samples[${String(i)}].grams`);
  });
  const confidence = options.confidence ?? 0.95;
  assertOpenUnit(confidence, 'confidence');
  const step = scaleStep(options);
  const chaffy = options.chaffy ?? false;
  const cvLimit = chaffy ? SEED_WEIGHT_RULES.cvLimit.chaffy : SEED_WEIGHT_RULES.cvLimit.other;

  const k = samples.length;
  const seeds = samples.reduce((s, x) => s + x.seeds, 0);
  const grams = samples.reduce((s, x) => s + x.grams, 0);
  const meanSeed = grams / seeds;

  // Between-sample variation of mean seed weight: Var(gᵢ/nᵢ) = σ²/nᵢ, so Σ nᵢ(gᵢ/nᵢ − m̄)²/(k − 1)
  // estimates the seed-to-seed variance σ²; the CV of a 100-seed replicate is σ/(10·m̄).
  let replicateCv: number | null = null;
  let observedSeedCv = 0;
  if (k >= 2) {
    const ss = samples.reduce((s, x) => s + x.seeds * (x.grams / x.seeds - meanSeed) ** 2, 0);
    observedSeedCv = Math.sqrt(ss / (k - 1)) / meanSeed;
    replicateCv = (100 * observedSeedCv) / Math.sqrt(SEED_WEIGHT_RULES.seedsPerReplicate);
  }
  const limitSeedCv = (cvLimit / 100) * Math.sqrt(SEED_WEIGHT_RULES.seedsPerReplicate);
  const enough = k >= SEED_WEIGHT_RULES.replicates;
  const seedCv = enough ? observedSeedCv : Math.max(observedSeedCv, limitSeedCv);
  const rulesReplicates = enough && samples.every((s) => s.seeds >= SEED_WEIGHT_RULES.seedsPerReplicate);

  const roundingVar = (k * step * step) / 12 / (grams * grams);
  const relativeSe = Math.sqrt((seedCv * seedCv) / seeds + roundingVar);
  const z = twoSidedZ(confidence);
  const seedsPerGram = seeds / grams;
  return {
    seedsPerGram,
    thousandSeedWeight: 1000 * meanSeed,
    sampleSeeds: seeds,
    sampleGrams: grams,
    replicates: k,
    replicateCv,
    cvLimit,
    cvCheck: replicateCv === null ? 'single-sample' : replicateCv <= cvLimit ? 'within-limit' : 'above-limit',
    rulesReplicates,
    seedCv,
    spreadBasis: enough ? 'replicates' : 'rules-limit',
    relativeSe,
    interval: logNormalRange(seedsPerGram, relativeSe, z),
  };
}

/** median·exp(±z·s) with s = √ln(1 + cv²): a positive quantity's range from its relative SE. */
export function logNormalRange(value: number, relativeSe: number, z: number): Interval {
  const s = Math.sqrt(Math.log1p(relativeSe * relativeSe));
  return { low: value * Math.exp(-z * s), high: value * Math.exp(z * s) };
}

/**
 * Our convention: without the lot's seeds per gram, a purity sample is taken to hold 100 pure seeds
 * when its sampling error is judged (a small home sample; more seeds would only narrow it).
 */
export const DEFAULT_PURITY_SAMPLE_SEEDS = 100;

export interface PurityOptions {
  scaleStepGrams?: number;
  /** The lot's seeds per gram, to count the pure seeds in the sample. */
  seedsPerGram?: number;
  confidence?: number;
}

export interface Purity {
  /** Pure-seed fraction by weight, as in a purity analysis: clean grams ÷ sample grams. */
  fraction: number;
  /** Its standard error. */
  se: number;
  interval: Interval;
  /** Pure seeds taken to be in the sample for its sampling error. */
  sampleSeeds: number;
}

/**
 * The pure-seed fraction of a weighed sample (sample grams; clean seed grams after the chaff and
 * other matter are picked out). Its SE (our model, documented here): a binomial-like sampling
 * error π(1 − π)/n over the n pure seeds in the sample (n from the lot's seeds per gram, else
 * DEFAULT_PURITY_SAMPLE_SEEDS), plus the scale's rounding in both weighings,
 * (step²/12)(1 + π²)/sample², by the delta method on clean/sample.
 */
export function purityFromSample(
  sampleGrams: number,
  cleanGrams: number,
  options: PurityOptions = {},
): Purity {
  assertGrams(sampleGrams, 'sampleGrams');
  if (!Number.isFinite(cleanGrams) || cleanGrams < 0) {
    throw new RangeError(`cleanGrams must be a weight of 0 grams or more (got ${String(cleanGrams)})`);
  }
  if (cleanGrams > sampleGrams) {
    throw new RangeError(
      `cleanGrams (${String(cleanGrams)}) cannot exceed sampleGrams (${String(sampleGrams)})`,
    );
  }
  const step = scaleStep(options);
  const confidence = options.confidence ?? 0.95;
  assertOpenUnit(confidence, 'confidence');
  if (options.seedsPerGram !== undefined) assertGrams(options.seedsPerGram, 'seedsPerGram');
  const fraction = cleanGrams / sampleGrams;
  const n = Math.max(
    1,
    options.seedsPerGram === undefined ? DEFAULT_PURITY_SAMPLE_SEEDS : cleanGrams * options.seedsPerGram,
  );
  const sampling = (fraction * (1 - fraction)) / n;
  const rounding = ((step * step) / 12) * ((1 + fraction * fraction) / (sampleGrams * sampleGrams));
  const se = Math.sqrt(sampling + rounding);
  const z = twoSidedZ(confidence);
  return {
    fraction,
    se,
    interval: { low: Math.max(0, fraction - z * se), high: Math.min(1, fraction + z * se) },
    sampleSeeds: n,
  };
}
