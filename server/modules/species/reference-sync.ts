import { SOURCES, SPECIES_REFERENCE, type SpeciesReference, type TraitKey } from '#shared/species-reference';
import { sourceRef, spaceSourcesOf, spaceTraitsOf, type SpaceTraitName } from '#shared/species-space';
import {
  seedSavingSourcesOf,
  seedSavingTraitsOf,
  type SeedSavingTraitName,
} from '#shared/species-seed-saving';
import type { SpeciesTraits, TraitName } from '#shared/schemas/species';
import type { DbOrTx } from '#server/db/database';
import { upsertReferenceSpecies } from './species.repository';

/** Which reference trait key carries the source of each of Hilum's computed traits. */
const SOURCE_OF: Record<Exclude<TraitName, SpaceTraitName | SeedSavingTraitName>, TraitKey> = {
  firstCountDay: 'firstCountDay',
  finalCountDay: 'finalCountDay',
  germTempMinC: 'germTemp',
  germTempMaxC: 'germTemp',
  light: 'lightToGerminate',
  startMethod: 'indoorStart',
  startWeeksFrom: 'indoorStart',
  startWeeksTo: 'indoorStart',
  seedsPerGram: 'seedsPerGramTypical',
  storageLifeYears: 'storageLifeYears',
  minGerminationPercent: 'minGerminationPercent',
  outcrossing: 'outcrossing',
  poisonous: 'poisonous',
  caution: 'poisonous',
  hardiness: 'hardiness',
  emergeDaysMin: 'emergenceDaysBySoilTemp',
  emergeDaysMax: 'emergenceDaysBySoilTemp',
};

/**
 * Days from sowing to seedlings at indoor sowing warmth: the days the source gives at home
 * conditions, else the emergence table at 77 °F (fewest) and 68 °F (most), the warm end of the
 * table where indoor sowings sit.
 */
export function emergeDays(s: SpeciesReference): { min: number; max: number } | null {
  if (s.homeGermination) return { min: s.homeGermination.daysMin, max: s.homeGermination.daysMax };
  const at = (f: number) => s.emergenceDaysBySoilTemp?.find((e) => e.soilF === f)?.days ?? null;
  const warm = at(77);
  const mild = at(68);
  if (warm === null || mild === null) return null;
  return { min: Math.min(warm, mild), max: Math.max(warm, mild) };
}

export function referenceTraits(s: SpeciesReference): SpeciesTraits {
  const range = s.seedsPerGram.range;
  return {
    firstCountDay: s.firstCountDay,
    finalCountDay: s.finalCountDay,
    germTempMinC: s.germTemp?.minC ?? null,
    germTempMaxC: s.germTemp?.maxC ?? null,
    light: s.lightToGerminate,
    startMethod: s.startMethod,
    startWeeksFrom: s.indoorStartWeeksBeforeFrost?.from ?? null,
    startWeeksTo: s.indoorStartWeeksBeforeFrost?.to ?? null,
    seedsPerGram: s.seedsPerGram.typical ?? (range ? (range.low + range.high) / 2 : null),
    storageLifeYears: s.storageLifeYears,
    minGerminationPercent: s.minGerminationPercent,
    outcrossing: s.outcrossing,
    poisonous: s.poisonous,
    caution: s.caution,
    hardiness: s.hardiness,
    emergeDaysMin: emergeDays(s)?.min ?? null,
    emergeDaysMax: emergeDays(s)?.max ?? null,
    ...spaceTraitsOf(s.key),
    ...seedSavingTraitsOf(s.key),
  };
}

export function referenceSources(s: SpeciesReference): Record<string, { title: string; basis: string }> {
  const traits = Object.keys(SOURCE_OF) as (keyof typeof SOURCE_OF)[];
  // Days to emerge come from the home-conditions days where a species has them, else the table.
  const keyOf = (trait: keyof typeof SOURCE_OF): TraitKey =>
    (trait === 'emergeDaysMin' || trait === 'emergeDaysMax') && s.homeGermination
      ? 'homeGermination'
      : SOURCE_OF[trait];
  return Object.fromEntries([
    ...traits.map((trait) => [trait, sourceRef(SOURCES[s.sources[keyOf(trait)]])]),
    ...Object.entries(spaceSourcesOf(s.key)),
    ...Object.entries(seedSavingSourcesOf(s.key)),
  ]);
}

/** Upserts the shipped reference species by key, so a new release's corrections reach every bank. */
export async function syncReferenceSpecies(db: DbOrTx): Promise<number> {
  for (const s of SPECIES_REFERENCE) {
    const values = {
      ref_key: s.key,
      common_name: s.commonName,
      scientific_name: s.scientificName,
      family: s.family,
      traits: JSON.stringify(referenceTraits(s)),
      sources: JSON.stringify(referenceSources(s)),
    };
    await upsertReferenceSpecies(db, values);
  }
  return SPECIES_REFERENCE.length;
}
