// A lot's seed weight as grams → seeds uses it: the lot's own seeds per gram and cleanliness from
// its weighed samples when it has any, else the species' typical seeds per gram. Pure: the
// repository reads the samples and the species' figure, the statistics do the arithmetic.
import {
  purityFromSample,
  seedsFromGrams,
  seedWeightFromSamples,
  SPECIES_SEEDS_PER_GRAM_CV,
  type SeedWeightSources,
} from '#server/stats/index';
import { logNormalRange } from '#server/stats/seed-weight';
import { twoSidedZ } from '#server/stats/distributions';

export interface SeedWeightSample {
  seeds: number;
  grams: number;
  /** Weight once the chaff is picked out; null when the sample was not cleaned. */
  cleanGrams: number | null;
}

/** The lot's `seedWeight` as it is read (null when neither the lot nor its species has a figure). */
export interface LotSeedWeight {
  seedsPerGram: number;
  /** Seeds counted in the lot's samples (null: the species' figure). */
  sampleSeeds: number | null;
  /** Their weight as clean seed (cleaned weight where given), grams. */
  sampleGrams: number | null;
  /** Clean seed ÷ material by weight, from the samples that were cleaned; null when none was. */
  purityFraction: number | null;
  basis: 'lot' | 'species';
  /** Grams per 1000 seeds (the seed-testing rules' thousand-seed weight). */
  thousandSeedWeight: number;
  /** Samples weighed (0 for the species' figure). */
  replicates: number;
  /** CV (%) of a 100-seed replicate's weight across the samples; null with fewer than two. */
  replicateCv: number | null;
  /** The rules' CV limit (%), null for the species' figure. */
  cvLimit: number | null;
  cvCheck: 'within-limit' | 'above-limit' | 'single-sample' | null;
  /** Plausible range (95%) of the lot's true seeds per gram. */
  range: { low: number; high: number };
  /** Plausible range (95%) of the pure-seed fraction, when known. */
  purityRange: { low: number; high: number } | null;
}

export interface LotSeedWeightFigures {
  /** What server/stats seedsFromGrams takes. */
  sources: SeedWeightSources;
  seedWeight: LotSeedWeight | null;
}

/**
 * The lot's figures from its samples and its species' typical seeds per gram. A sample's seeds are
 * weighed as clean seed when it was cleaned (clean grams), else as weighed: seeds counted out of a
 * lot are seeds. The pure-seed fraction pools the cleaned samples (Σ clean ÷ Σ weighed), as a
 * purity analysis of their combined weight.
 */
export function lotSeedWeight(
  samples: readonly SeedWeightSample[],
  speciesSeedsPerGram: number | null,
): LotSeedWeightFigures {
  const species =
    speciesSeedsPerGram && speciesSeedsPerGram > 0 ? { seedsPerGram: speciesSeedsPerGram } : null;
  if (samples.length === 0) {
    if (!species) return { sources: { lot: null, species: null, purity: null }, seedWeight: null };
    return {
      sources: { lot: null, species, purity: null },
      seedWeight: {
        seedsPerGram: species.seedsPerGram,
        sampleSeeds: null,
        sampleGrams: null,
        purityFraction: null,
        basis: 'species',
        thousandSeedWeight: 1000 / species.seedsPerGram,
        replicates: 0,
        replicateCv: null,
        cvLimit: null,
        cvCheck: null,
        range: logNormalRange(species.seedsPerGram, SPECIES_SEEDS_PER_GRAM_CV, twoSidedZ(0.95)),
        purityRange: null,
      },
    };
  }
  const weight = seedWeightFromSamples(
    samples.map((s) => ({ seeds: s.seeds, grams: s.cleanGrams ?? s.grams })),
  );
  const cleaned = samples.filter((s) => s.cleanGrams !== null);
  const purity =
    cleaned.length > 0
      ? purityFromSample(
          cleaned.reduce((sum, s) => sum + s.grams, 0),
          cleaned.reduce((sum, s) => sum + (s.cleanGrams ?? 0), 0),
          { seedsPerGram: weight.seedsPerGram },
        )
      : null;
  return {
    sources: {
      lot: { seedsPerGram: weight.seedsPerGram, relativeSe: weight.relativeSe, seedCv: weight.seedCv },
      species,
      purity: purity ? { fraction: purity.fraction, se: purity.se } : null,
    },
    seedWeight: {
      seedsPerGram: weight.seedsPerGram,
      sampleSeeds: weight.sampleSeeds,
      sampleGrams: weight.sampleGrams,
      purityFraction: purity?.fraction ?? null,
      basis: 'lot',
      thousandSeedWeight: weight.thousandSeedWeight,
      replicates: weight.replicates,
      replicateCv: weight.replicateCv,
      cvLimit: weight.cvLimit,
      cvCheck: weight.cvCheck,
      range: weight.interval,
      purityRange: purity?.interval ?? null,
    },
  };
}

/** Seeds in a weighed amount, and the figure that turned the grams into them. */
export interface WeighedAmount {
  seeds: number;
  basis: 'lot' | 'species';
  seedsPerGram: number;
  purityFraction: number | null;
}

/**
 * The seeds in `grams` of the lot's material (seedsFromGrams: grams × purity × seeds per gram, the
 * lot's own figure first), rounded to a whole seed; null when neither the lot nor its species has a
 * seeds-per-gram figure.
 */
export function weighedAmount(grams: number, sources: SeedWeightSources): WeighedAmount | null {
  const perGram = sources.lot ?? sources.species;
  if (!perGram) return null;
  const estimate = seedsFromGrams(grams, sources);
  return {
    seeds: Math.round(estimate.mean),
    basis: estimate.basis ?? 'species',
    seedsPerGram: perGram.seedsPerGram,
    purityFraction: sources.purity?.fraction ?? null,
  };
}

/** "at this lot's 300 seeds per gram (75% clean seed)" — the figure a weighed amount used, in words. */
export function weighedAmountWords(amount: WeighedAmount): string {
  const perGram = amount.seedsPerGram.toLocaleString('en', {
    maximumFractionDigits: amount.seedsPerGram < 10 ? 2 : 0,
  });
  const whose =
    amount.basis === 'lot'
      ? `this lot's own ${perGram} seeds per gram (from its weighed samples)`
      : `about ${perGram} seeds per gram (the species' typical figure)`;
  const clean =
    amount.purityFraction !== null
      ? `, ${Math.round(amount.purityFraction * 100)}% of the weight clean seed`
      : '';
  return `${whose}${clean}`;
}
