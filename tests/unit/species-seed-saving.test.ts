import { describe, expect, it } from 'vitest';
import { SPECIES_REFERENCE, sourceSchema } from '#shared/species-reference';
import {
  METERS_PER_FOOT,
  METERS_PER_MILE,
  SEED_SAVING_SOURCES,
  SPECIES_SEED_SAVING,
  outcrossingOf,
  seedSavingTraitsOf,
  toMeters,
} from '#shared/species-seed-saving';
import { speciesTraitsSchema } from '#shared/schemas/species';
import { referenceSources, referenceTraits } from '#server/modules/species/reference-sync';

const FIELDS = ['pollination', 'isolationMeters', 'minPlantsForSeed', 'biennial'] as const;
const ABSENT = new Set(['unknown', 'not-published']);

describe('the reference species’ seed-saving traits', () => {
  it('when every reference species is synced, then each carries the four traits, each with a named source', () => {
    const problems: string[] = [];
    for (const s of SPECIES_REFERENCE) {
      if (!SPECIES_SEED_SAVING[s.key]) problems.push(`${s.key}: not listed`);
      const traits = referenceTraits(s);
      expect(speciesTraitsSchema.safeParse(traits).success, s.key).toBe(true);
      const sources = referenceSources(s);
      for (const f of FIELDS) {
        const value = traits[f];
        const source = sources[f];
        if (value === undefined) problems.push(`${s.key}.${f}: missing`);
        if (!source?.title) problems.push(`${s.key}.${f}: no source named`);
        else if (value === null && !ABSENT.has(source.basis))
          problems.push(`${s.key}.${f}: null but cites a ${source.basis} source`);
        else if (value !== null && ABSENT.has(source.basis))
          problems.push(`${s.key}.${f}: has a value but its source says there is none`);
      }
    }
    expect(
      Object.keys(SPECIES_SEED_SAVING).filter((k) => !SPECIES_REFERENCE.some((s) => s.key === k)),
    ).toEqual([]);
    expect(problems).toEqual([]);
  });

  it('when its sources are read, then each is well formed, and a memory one says so in words', () => {
    for (const [key, s] of Object.entries(SEED_SAVING_SOURCES)) {
      expect(sourceSchema.safeParse(s).success, key).toBe(true);
      if (s.basis === 'memory') expect(s.note, key).toMatch(/from memory/i);
    }
    const cited = new Set(Object.values(SPECIES_SEED_SAVING).flatMap((r) => Object.values(r.sources)));
    expect(Object.keys(SEED_SAVING_SOURCES).filter((k) => !cited.has(k as never))).toEqual([]);
  });

  it('when pollination is compared with the species’ self- or cross-pollinating habit, then they agree', () => {
    for (const s of SPECIES_REFERENCE) {
      expect(outcrossingOf(seedSavingTraitsOf(s.key).pollination), s.key).toBe(s.outcrossing);
    }
  });

  it('when distances are converted, then feet and miles become metres exactly', () => {
    // International foot 0.3048 m and mile 1609.344 m (definitions of the units).
    expect(METERS_PER_FOOT).toBe(0.3048);
    expect(METERS_PER_MILE).toBe(1609.344);
    expect(toMeters({ amount: 20, unit: 'ft' })).toBeCloseTo(6.096, 9);
    expect(toMeters({ amount: 0.5, unit: 'mi' })).toBeCloseTo(804.672, 9);
    expect(toMeters({ amount: 100, unit: 'm' })).toBe(100);
  });

  it('when annual vegetables are looked up, then they match the garden seed-saving chart as read', () => {
    // Seed Saving Chart, garden-scale isolation distances and plant populations [read]:
    // tomato self 10 ft 10 plants; pepper self ("insects do pollinate") 100 ft 10; eggplant self
    // 50 ft 10; lettuce self 20 ft 10; pea self 20 ft 25; bean self 20 ft 10; cucumber insect
    // ½ mi 10; pumpkin (Cucurbita pepo) insect ½ mi 10; spinach wind 2 mi 50.
    const chart: [string, string, number, number][] = [
      ['tomato', 'self', 10 * 0.3048, 10],
      ['pepper', 'mixed', 100 * 0.3048, 10],
      ['eggplant', 'self', 50 * 0.3048, 10],
      ['lettuce', 'self', 20 * 0.3048, 10],
      ['pea', 'self', 20 * 0.3048, 25],
      ['bean', 'self', 20 * 0.3048, 10],
      ['cucumber', 'insect', 0.5 * 1609.344, 10],
      ['squash', 'insect', 0.5 * 1609.344, 10],
      ['spinach', 'wind', 2 * 1609.344, 50],
    ];
    for (const [key, pollination, meters, plants] of chart) {
      const t = seedSavingTraitsOf(key);
      expect(t.pollination, key).toBe(pollination);
      expect(t.isolationMeters, key).toBeCloseTo(meters, 6);
      expect(t.minPlantsForSeed, key).toBe(plants);
      expect(SPECIES_SEED_SAVING[key]!.sources).toMatchObject({
        pollination: 'gardenSeedChart',
        isolationMeters: 'gardenSeedChart',
        minPlantsForSeed: 'gardenSeedChart',
      });
    }
    // The same chart gives sweet corn wind-pollinated and 100 plants [read].
    expect(seedSavingTraitsOf('sweet-corn')).toMatchObject({ pollination: 'wind', minPlantsForSeed: 100 });
    // A seed-saving course summary (Seeds of Diversity, 2009) [read]: selfers from no fewer than
    // 12–16 plants. The chart's garden figure for tomato (10) is under it: both are published, and
    // Hilum's warning uses the chart's; the chart's self-pollinated crops all ask for 10 or more.
    for (const s of SPECIES_REFERENCE.filter((x) => seedSavingTraitsOf(x.key).pollination === 'self'))
      expect(seedSavingTraitsOf(s.key).minPlantsForSeed, s.key).toBeGreaterThanOrEqual(10);
    // Sweet pea, a selfer the chart does not list, takes the course's lower end, 12.
    expect(seedSavingTraitsOf('sweet-pea').minPlantsForSeed).toBe(12);
    expect(SPECIES_SEED_SAVING['sweet-pea']!.sources.minPlantsForSeed).toBe('selferCourseNotes');
  });

  it('when the brassicas and beet are looked up, then they match the seed saving guide as read', () => {
    // A seed saving institute's guide, quoted on a forum [read, secondary]: Brassica oleracea
    // varieties at least 1000 feet apart; beet pollen carried by wind, save from at least 6 roots.
    for (const key of ['cabbage', 'broccoli', 'kale']) {
      expect(seedSavingTraitsOf(key).isolationMeters, key).toBeCloseTo(1000 * 0.3048, 6);
      expect(SPECIES_SEED_SAVING[key]!.sources.isolationMeters).toBe('seedSavingInstituteGuide');
    }
    expect(seedSavingTraitsOf('beet')).toMatchObject({ pollination: 'wind', minPlantsForSeed: 6 });
  });

  it('when biennials are looked up, then onion, leek, carrot, beet, cabbage, kale and parsley are, as the life-cycle table reads', () => {
    // Vegetable classification table [read]: beets, cabbage, carrot, kale, leeks, onions, parsley
    // biennial; bean, broccoli, cucumber, eggplant, lettuce, pea, pepper, spinach, squash, tomato,
    // corn annual.
    const biennial = ['onion', 'leek', 'carrot', 'beet', 'cabbage', 'kale', 'parsley'];
    const annual = ['bean', 'broccoli', 'cucumber', 'eggplant', 'lettuce', 'pea', 'pepper', 'spinach'];
    for (const key of biennial) expect(seedSavingTraitsOf(key).biennial, key).toBe(true);
    for (const key of [...annual, 'squash', 'tomato', 'sweet-corn'])
      expect(seedSavingTraitsOf(key).biennial, key).toBe(false);
    for (const key of [...biennial, ...annual])
      expect(SEED_SAVING_SOURCES[SPECIES_SEED_SAVING[key]!.sources.biennial].basis, key).toBe('read');
  });
});
