// Keeping a variety true: how each reference species is pollinated, how far apart two varieties
// are kept for seed saving, how many plants to save seed from, and whether it is a biennial (seed
// in its second season, after a winter). Kept beside species-reference.ts, as species-space.ts is
// (same Source records, same honesty about where a value comes from); reference-sync.ts merges
// these into each species' traits. The coarse `outcrossing` of species-reference.ts is this
// `pollination` seen from afar (self → self, mixed → mixed, insect or wind → cross):
// tests/unit/species-seed-saving.test.ts holds the two together.
import type { Source } from './species-reference';
import type { Pollination } from './schemas/species';
import { sourceRef } from './species-space';

export const SEED_SAVING_SOURCES = {
  gardenSeedChart: {
    title:
      'Seed Saving Chart: isolation distances and plant populations for garden-scale seed saving (annual vegetables)',
    publisher: null,
    year: null,
    basis: 'read',
    note: 'A seed-saving organisation’s chart, read as reproduced on a document-sharing site; publisher not recorded. Distances in feet or miles as printed, converted exactly (1 ft = 0.3048 m, 1 mile = 1609.344 m).',
  },
  lifeCycleTable: {
    title: 'Vegetable classification and seed storage life: pollination (self or cross) and life cycle',
    publisher: null,
    year: null,
    basis: 'read',
    note: 'Read on a gardening page reproducing the table; publisher not recorded. Annual or biennial as the table gives it.',
  },
  seedSavingInstituteGuide: {
    title:
      'Seed saving instructions for the expert gardener: beet and chard, cabbage family (a seed saving institute’s guide)',
    publisher: null,
    year: null,
    basis: 'read',
    note: 'Read as quoted on a forum (secondary). Beet: pollen carried by wind, save from at least 6 roots. Brassica oleracea: at least 1000 feet between varieties for satisfactory results (a mile for purity).',
  },
  selferCourseNotes: {
    title:
      'Plant populations and isolation distances, summary of a principles-of-seed-production course (Seeds of Diversity magazine, August 2009)',
    publisher: 'Seeds of Diversity',
    year: 2009,
    basis: 'read',
    note: 'Read on the author’s page. Self-pollinating crops: save from no fewer than 12–16 plants (50–80 preferred); most need 80–150 feet of isolation as they still cross a little.',
  },
  isolationMemory: {
    title: 'Isolation distance for garden seed saving, as seed-saving handbooks give it',
    publisher: null,
    year: null,
    basis: 'memory',
    note: 'From memory; handbooks differ widely (a few hundred metres to miles). Confirm against a seed-saving handbook or local extension advice.',
  },
  populationMemory: {
    title: 'Plants to save seed from to avoid inbreeding depression, as seed-saving handbooks give it',
    publisher: null,
    year: null,
    basis: 'memory',
    note: 'From memory; confirm against a seed-saving handbook.',
  },
  pollinationMemory: {
    title: 'How the species is pollinated (insects, wind, mostly self), as seed-saving guides describe it',
    publisher: null,
    year: null,
    basis: 'memory',
    note: 'From memory; agrees with the self- or cross-pollinating habit recorded for the species.',
  },
  annualMemory: {
    title: 'Grown from seed as an annual: flowers and sets seed in its first season',
    publisher: null,
    year: null,
    basis: 'memory',
    note: 'From memory (garden flowers and herbs sown in spring set seed the same year).',
  },
  noSeedSavingValue: {
    title: 'No value',
    publisher: null,
    year: null,
    basis: 'unknown',
    note: 'How this species is pollinated is not recorded in the species reference; left empty on purpose rather than guessed.',
  },
} as const satisfies Record<string, Source>;
export type SeedSavingSourceKey = keyof typeof SEED_SAVING_SOURCES;

export { POLLINATION, type Pollination } from './schemas/species';

/** The four traits of keeping a variety true, as a species carries them. */
export interface SeedSavingTraits {
  pollination: Pollination | null;
  /** Metres between two varieties of the species for seed to come true (null: not known). */
  isolationMeters: number | null;
  /** Fewest plants to save seed from without inbreeding depression (null: not known). */
  minPlantsForSeed: number | null;
  /** Flowers and sets seed in its second season, after a winter. */
  biennial: boolean;
}
export type SeedSavingTraitName = keyof SeedSavingTraits;

/** A distance as the source prints it. */
export interface DistanceAsRead {
  amount: number;
  unit: 'ft' | 'mi' | 'm';
}

export const METERS_PER_FOOT = 0.3048; // international foot, exact
export const METERS_PER_MILE = 1609.344; // international mile, exact

export function toMeters(d: DistanceAsRead): number {
  return d.unit === 'ft'
    ? d.amount * METERS_PER_FOOT
    : d.unit === 'mi'
      ? d.amount * METERS_PER_MILE
      : d.amount;
}

export interface SeedSavingRecord {
  pollination: Pollination | null;
  isolation: DistanceAsRead | null;
  minPlantsForSeed: number | null;
  biennial: boolean;
  sources: Record<SeedSavingTraitName, SeedSavingSourceKey>;
}

const ft = (amount: number): DistanceAsRead => ({ amount, unit: 'ft' });
const mi = (amount: number): DistanceAsRead => ({ amount, unit: 'mi' });
const m = (amount: number): DistanceAsRead => ({ amount, unit: 'm' });

type Sources = SeedSavingRecord['sources'];
/** Everything read in the garden chart; life cycle from the table. */
const CHART: Sources = {
  pollination: 'gardenSeedChart',
  isolationMeters: 'gardenSeedChart',
  minPlantsForSeed: 'gardenSeedChart',
  biennial: 'lifeCycleTable',
};
const MEMORY: Sources = {
  pollination: 'pollinationMemory',
  isolationMeters: 'isolationMemory',
  minPlantsForSeed: 'populationMemory',
  biennial: 'lifeCycleTable',
};
const FLOWER: Sources = { ...MEMORY, biennial: 'annualMemory' };
const NOT_RECORDED: SeedSavingRecord = {
  pollination: null,
  isolation: null,
  minPlantsForSeed: null,
  biennial: false,
  sources: {
    pollination: 'noSeedSavingValue',
    isolationMeters: 'noSeedSavingValue',
    minPlantsForSeed: 'noSeedSavingValue',
    biennial: 'annualMemory',
  },
};

const rec = (
  pollination: Pollination,
  isolation: DistanceAsRead,
  minPlantsForSeed: number,
  biennial: boolean,
  sources: Sources,
): SeedSavingRecord => ({ pollination, isolation, minPlantsForSeed, biennial, sources });

/** By reference species key (shared/species-reference.ts); every reference species is listed. */
export const SPECIES_SEED_SAVING: Readonly<Record<string, SeedSavingRecord>> = {
  // Annual vegetables read in the garden chart (life cycle in the table).
  tomato: rec('self', ft(10), 10, false, CHART),
  // The chart: "self — primarily selfers, but insects do pollinate".
  pepper: rec('mixed', ft(100), 10, false, CHART),
  eggplant: rec('self', ft(50), 10, false, CHART),
  lettuce: rec('self', ft(20), 10, false, CHART),
  pea: rec('self', ft(20), 25, false, CHART),
  bean: rec('self', ft(20), 10, false, CHART),
  cucumber: rec('insect', mi(0.5), 10, false, CHART),
  // The chart's pumpkin (Cucurbita pepo) row: insect, ½ mile, 10 plants.
  squash: rec('insect', mi(0.5), 10, false, CHART),
  spinach: rec('wind', mi(2), 50, false, CHART),
  // The chart's corn row: wind, 100 plants; its distance did not read cleanly, so it is from memory.
  'sweet-corn': rec('wind', mi(1), 100, false, { ...CHART, isolationMeters: 'isolationMemory' }),
  // Biennials (life cycle read in the table); distances and populations mostly from memory.
  onion: rec('insect', mi(1), 20, true, MEMORY),
  leek: rec('insect', mi(1), 20, true, MEMORY),
  carrot: rec('insect', mi(0.5), 20, true, MEMORY),
  beet: rec('wind', mi(1), 6, true, {
    pollination: 'seedSavingInstituteGuide',
    isolationMeters: 'isolationMemory',
    minPlantsForSeed: 'seedSavingInstituteGuide',
    biennial: 'lifeCycleTable',
  }),
  cabbage: rec('insect', ft(1000), 20, true, { ...MEMORY, isolationMeters: 'seedSavingInstituteGuide' }),
  kale: rec('insect', ft(1000), 20, true, { ...MEMORY, isolationMeters: 'seedSavingInstituteGuide' }),
  // Broccoli flowers in its first season (annual in the table).
  broccoli: rec('insect', ft(1000), 20, false, { ...MEMORY, isolationMeters: 'seedSavingInstituteGuide' }),
  parsley: rec('insect', mi(0.5), 20, true, MEMORY),
  basil: rec('insect', ft(150), 10, false, { ...MEMORY, biennial: 'annualMemory' }),
  // Garden flowers, all from memory.
  marigold: rec('insect', m(100), 10, false, FLOWER),
  zinnia: rec('insect', m(100), 10, false, FLOWER),
  cosmos: rec('insect', m(100), 10, false, FLOWER),
  calendula: rec('insect', m(100), 10, false, FLOWER),
  nasturtium: rec('insect', m(100), 10, false, FLOWER),
  viola: rec('insect', m(100), 10, false, FLOWER),
  sunflower: rec('insect', mi(0.5), 20, false, FLOWER),
  poppy: rec('insect', m(100), 20, false, FLOWER),
  // A selfer: the course notes' fewest plants for self-pollinating crops (12–16), the lower end.
  'sweet-pea': rec('self', ft(20), 12, false, { ...FLOWER, minPlantsForSeed: 'selferCourseNotes' }),
  // The species reference records no pollination habit for these: no value rather than a guess.
  petunia: NOT_RECORDED,
  snapdragon: NOT_RECORDED,
  aster: NOT_RECORDED,
  'morning-glory': NOT_RECORDED,
};

/** The pollination habit the species reference's coarse `outcrossing` stands for. */
export function outcrossingOf(p: Pollination | null): 'self' | 'cross' | 'mixed' | null {
  if (p === null) return null;
  return p === 'insect' || p === 'wind' ? 'cross' : p;
}

/** A species crosses with other varieties of its kind (insect, wind or mixed pollination). */
export const crosses = (p: Pollination | null | undefined): p is Exclude<Pollination, 'self'> =>
  p === 'insect' || p === 'wind' || p === 'mixed';

/** A reference species' seed-saving traits (nulls and not biennial when it is not listed). */
export function seedSavingTraitsOf(key: string): SeedSavingTraits {
  const r = SPECIES_SEED_SAVING[key] ?? NOT_RECORDED;
  return {
    pollination: r.pollination,
    isolationMeters: r.isolation ? toMeters(r.isolation) : null,
    minPlantsForSeed: r.minPlantsForSeed,
    biennial: r.biennial,
  };
}

/** Where each seed-saving trait of a reference species comes from, in the species' `sources` form. */
export function seedSavingSourcesOf(
  key: string,
): Record<SeedSavingTraitName, { title: string; basis: string }> {
  const r = SPECIES_SEED_SAVING[key] ?? NOT_RECORDED;
  const of = (k: SeedSavingSourceKey) => sourceRef(SEED_SAVING_SOURCES[k]);
  return {
    pollination: of(r.sources.pollination),
    isolationMeters: of(r.sources.isolationMeters),
    minPlantsForSeed: of(r.sources.minPlantsForSeed),
    biennial: of(r.sources.biennial),
  };
}
