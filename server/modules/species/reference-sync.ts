import { SOURCES, SPECIES_REFERENCE, type SpeciesReference, type TraitKey } from '#shared/species-reference';
import { sourceRef, spaceSourcesOf, spaceTraitsOf, type SpaceTraitName } from '#shared/species-space';
import type { SpeciesTraits, TraitName } from '#shared/schemas/species';
import type { DbOrTx } from '#server/db/database';
import { upsertReferenceSpecies } from './species.repository';

/** Which reference trait key carries the source of each of Hilum's computed traits. */
const SOURCE_OF: Record<Exclude<TraitName, SpaceTraitName>, TraitKey> = {
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
};

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
    ...spaceTraitsOf(s.key),
  };
}

export function referenceSources(s: SpeciesReference): Record<string, { title: string; basis: string }> {
  const traits = Object.keys(SOURCE_OF) as (keyof typeof SOURCE_OF)[];
  return Object.fromEntries([
    ...traits.map((trait) => [trait, sourceRef(SOURCES[s.sources[SOURCE_OF[trait]]])]),
    ...Object.entries(spaceSourcesOf(s.key)),
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
