import { describe, expect, it } from 'vitest';
import {
  SOWN_GUESS_RANGES,
  SPECIES_SEEDS_PER_GRAM_CV,
  seedWeightFromSamples,
  seedsFromGrams,
  sownByCount,
  sownFromGuess,
} from '#server/stats/index';

describe('grams to an estimated number of seeds', () => {
  const lot = seedWeightFromSamples([
    { seeds: 100, grams: 0.25 },
    { seeds: 100, grams: 0.26 },
  ]);

  it('when the lot has its own seed weight, then it is used and the basis says "lot"', () => {
    const sown = seedsFromGrams(0.5, { lot, species: { seedsPerGram: 900 } });
    expect(sown.basis).toBe('lot');
    expect(sown.by).toBe('weight');
    // 0.5 g × 200/0.51 seeds per gram = 196.08 [computed]; the species' 900 is ignored.
    expect(sown.mean).toBeCloseTo((0.5 * 200) / 0.51, 9);
    expect(sown.purityAssumed).toBe(true);
  });

  it('when the lot has no seed weight, then the species’ figure is the fallback with its wide spread', () => {
    const sown = seedsFromGrams(0.5, { lot: null, species: { seedsPerGram: 390 } });
    expect(sown.basis).toBe('species');
    expect(sown.mean).toBeCloseTo(195, 9);
    // At least the species' relative SD (our convention, 0.35) — far wider than the lot's own figure.
    expect(sown.sd / sown.mean).toBeGreaterThanOrEqual(SPECIES_SEEDS_PER_GRAM_CV);
    const own = seedsFromGrams(0.5, { lot });
    expect(sown.sd / sown.mean).toBeGreaterThan((2 * own.sd) / own.mean);
  });

  it('when neither the lot nor the species has a figure, then grams cannot become seeds', () => {
    expect(() => seedsFromGrams(0.5, {})).toThrow(/neither the lot nor its species/);
  });

  it('when the lot is chaffy, then purity lowers the count and adds its uncertainty', () => {
    const clean = seedsFromGrams(1, { lot });
    const chaffy = seedsFromGrams(1, { lot, purity: { fraction: 0.6, se: 0.03 } });
    expect(chaffy.mean).toBeCloseTo(clean.mean * 0.6, 9);
    expect(chaffy.sd / chaffy.mean).toBeGreaterThan(clean.sd / clean.mean);
    expect(chaffy.purityAssumed).toBe(false);
    expect(chaffy.range.low).toBeLessThan(chaffy.mean);
    expect(chaffy.range.high).toBeGreaterThan(chaffy.mean);
  });

  it('when the variance is worked by hand, then it matches the documented delta-method sum', () => {
    const sown = seedsFromGrams(
      0.4,
      { lot: { seedsPerGram: 300, relativeSe: 0.05, seedCv: 0.3 }, purity: { fraction: 0.8, se: 0.04 } },
      { scaleStepGrams: 0.01 },
    );
    const mu = 0.4 * 0.8 * 300; // 96 seeds [computed]
    const relVar = 0.05 ** 2 + (0.04 / 0.8) ** 2 + 0.0001 / 12 / 0.16;
    expect(sown.mean).toBeCloseTo(mu, 9);
    expect(sown.sd).toBeCloseTo(Math.sqrt(mu * mu * relVar + mu * (0.09 + 0.2)), 9);
  });
});

describe('a rough guess and a count', () => {
  it('when a grower guesses, then the documented range (our convention) comes back with a mean inside it', () => {
    for (const about of ['pinch', 'few-dozen', 'hundreds'] as const) {
      const sown = sownFromGuess(about);
      expect(sown.by).toBe('guess');
      expect(sown.range).toEqual(SOWN_GUESS_RANGES[about]);
      expect(sown.mean).toBeGreaterThan(sown.range.low);
      expect(sown.mean).toBeLessThan(sown.range.high);
      // Wide on purpose: a relative SD above 25% for every guess.
      expect(sown.sd / sown.mean).toBeGreaterThan(0.25);
    }
  });

  it('when seeds are counted, then there is no spread', () => {
    expect(sownByCount(50)).toMatchObject({ by: 'count', mean: 50, sd: 0, basis: null });
  });
});
