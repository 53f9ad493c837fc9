import { describe, expect, it } from 'vitest';
import { lotSeedWeight, weighedAmount } from '#server/modules/lots/lot-seed-weight';
import { purityFromSample, seedWeightFromSamples, SPECIES_SEEDS_PER_GRAM_CV } from '#server/stats/index';

// AOSA Rules Appendix 4 worked example (FRSA tutorial, 2001), as ISTA Rules ch. 10 weighs the
// thousand-seed weight: eight replicates of 100 seeds, grams [read]; 468.906 seeds per gram [computed].
const AOSA_EXAMPLE = [0.2224, 0.2134, 0.213, 0.2116, 0.2145, 0.2071, 0.2116, 0.2125];

describe('a lot’s seed weight from its samples, else its species’', () => {
  it('when the lot has no samples, then the species’ figure is used with its ±35% convention', () => {
    const { sources, seedWeight } = lotSeedWeight([], 390);
    expect(sources).toEqual({ lot: null, species: { seedsPerGram: 390 }, purity: null });
    expect(seedWeight).toMatchObject({
      basis: 'species',
      seedsPerGram: 390,
      sampleSeeds: null,
      replicates: 0,
    });
    // Log-normal range at relative SD 0.35: s = √ln(1.1225) = 0.33988, ×exp(±1.96 s) [computed].
    expect(SPECIES_SEEDS_PER_GRAM_CV).toBe(0.35);
    const s = Math.sqrt(Math.log(1 + 0.35 ** 2));
    expect(seedWeight!.range.low).toBeCloseTo(390 * Math.exp(-1.959964 * s), 3);
    expect(seedWeight!.range.high).toBeCloseTo(390 * Math.exp(1.959964 * s), 3);
  });

  it('when neither has a figure, then there is none, and a weight cannot become seeds', () => {
    const figures = lotSeedWeight([], null);
    expect(figures.seedWeight).toBeNull();
    expect(weighedAmount(4, figures.sources)).toBeNull();
  });

  it('when the rules’ eight replicates are weighed, then the lot’s figure is theirs (ISTA ch. 10 / AOSA App. 4)', () => {
    const { sources, seedWeight } = lotSeedWeight(
      AOSA_EXAMPLE.map((grams) => ({ seeds: 100, grams, cleanGrams: null })),
      390,
    );
    expect(seedWeight!.basis).toBe('lot');
    expect(seedWeight!.seedsPerGram).toBeCloseTo(468.9057, 3);
    expect(seedWeight!.thousandSeedWeight).toBeCloseTo(2.132625, 9);
    expect(seedWeight!.cvCheck).toBe('within-limit');
    expect(sources.species).toEqual({ seedsPerGram: 390 });
    // 4 g → 1,875.6 → 1,876 seeds, by the lot's figure, not the species' 1,560.
    expect(weighedAmount(4, sources)).toEqual({
      seeds: 1876,
      basis: 'lot',
      seedsPerGram: sources.lot!.seedsPerGram,
      purityFraction: null,
    });
  });

  it('when some samples were cleaned, then seeds per gram is of clean seed and purity pools the cleaned ones', () => {
    // Made up: two pinches cleaned (1.0 → 0.6 g, 0.5 → 0.35 g) and one count of clean seed.
    const samples = [
      { seeds: 180, grams: 1, cleanGrams: 0.6 },
      { seeds: 100, grams: 0.5, cleanGrams: 0.35 },
      { seeds: 100, grams: 0.33, cleanGrams: null },
    ];
    const { sources, seedWeight } = lotSeedWeight(samples, 390);
    const weight = seedWeightFromSamples([
      { seeds: 180, grams: 0.6 },
      { seeds: 100, grams: 0.35 },
      { seeds: 100, grams: 0.33 },
    ]);
    expect(seedWeight!.seedsPerGram).toBeCloseTo(weight.seedsPerGram, 12);
    expect(seedWeight!.sampleGrams).toBeCloseTo(1.28, 12);
    // Purity of the pooled cleaned samples: 0.95 g clean of 1.5 g weighed [computed].
    const purity = purityFromSample(1.5, 0.95, { seedsPerGram: weight.seedsPerGram });
    expect(seedWeight!.purityFraction).toBeCloseTo(0.95 / 1.5, 12);
    expect(sources.purity).toEqual({ fraction: purity.fraction, se: purity.se });
    expect(seedWeight!.purityRange).toEqual(purity.interval);
  });
});
