// Keeping a variety true: the warnings Hilum gives on parent plants, pure. Too few plants saved
// from (under the species' minPlantsForSeed: inbreeding depression), and two varieties of a
// crossing species (insect, wind or mixed pollination) in flower in the same garden season without
// a recorded isolation, or with a distance under the species' isolationMeters. A pair of varieties
// counts as kept apart when either side records staggered flowering, bagging or caging, or a
// distance at least the species' (a distance is the same seen from either side) — Hilum's rule.
import type { Isolation, SeedSavingWarning } from '#shared/schemas/seed-saving';
import type { SpeciesTraits } from '#shared/schemas/species';
import { crosses } from '#shared/species-seed-saving';

export interface KeptPlant {
  id: string;
  speciesId: string;
  label: string;
  variety: string | null;
  season: number | null;
  isolation: Isolation | null;
}

export interface SpeciesForWarnings {
  commonName: string;
  traits: SpeciesTraits;
}

/** The caution beside every isolation warning: distances are a guide, local advice knows the area. */
export const LOCAL_ADVICE =
  'Distances are a guide: wind, bees and neighbours’ gardens change them, so follow local seed-saving or extension advice.';

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;
const metres = (m: number) => `${Math.round(m).toLocaleString('en')} m`;
/** A variety as compared: names differing only in case or spacing are one variety. */
export const varietyKey = (v: string | null) => (v ?? '').trim().toLowerCase();
const varietyName = (v: string | null) => (v && v.trim() ? `“${v.trim()}”` : 'an unnamed variety');

const HOW: Record<'insect' | 'wind' | 'mixed', string> = {
  insect: 'is pollinated by insects',
  wind: 'is pollinated by the wind',
  mixed: 'mostly pollinates itself but is crossed by insects now and then',
};

/** A warning when seed was saved from fewer plants than the species needs; null when enough or not known. */
export function populationWarning(
  species: SpeciesForWarnings,
  savedFrom: number | null,
): SeedSavingWarning | null {
  const needed = species.traits.minPlantsForSeed ?? null;
  if (needed === null || savedFrom === null || savedFrom >= needed) return null;
  return {
    kind: 'population',
    message: `Seed saved from ${plural(savedFrom, 'plant', 'plants')}: ${species.commonName} needs at least ${needed} plants to keep the variety vigorous, and with fewer it loses vigour to inbreeding. Save from ${needed} plants or more next time, or mix in seed of the same variety from another grower.`,
  };
}

/** The pair is kept apart when either side records time, bagging, or enough distance. */
function keptApart(records: (Isolation | null)[], needed: number | null): boolean {
  if (records.some((r) => r?.method === 'time' || r?.method === 'bagging')) return true;
  const distances = records.flatMap((r) => (r?.method === 'distance' ? [r.meters] : []));
  if (distances.length === 0) return false;
  return needed === null || Math.max(...distances) >= needed;
}

/**
 * Warnings for `plant` against the bank's other parent plants: one per other variety of its species
 * that grew in the same season without being kept apart from it.
 */
export function isolationWarnings(
  plant: KeptPlant,
  bankPlants: KeptPlant[],
  species: SpeciesForWarnings,
): SeedSavingWarning[] {
  const pollination = species.traits.pollination ?? null;
  if (!crosses(pollination) || plant.season === null) return [];
  const needed = species.traits.isolationMeters ?? null;
  const others = new Map<string, KeptPlant[]>();
  for (const o of bankPlants) {
    if (o.id === plant.id || o.speciesId !== plant.speciesId || o.season !== plant.season) continue;
    if (varietyKey(o.variety) === varietyKey(plant.variety)) continue;
    others.set(varietyKey(o.variety), [...(others.get(varietyKey(o.variety)) ?? []), o]);
  }
  const out: SeedSavingWarning[] = [];
  for (const group of others.values()) {
    const records = [plant.isolation, ...group.map((o) => o.isolation)];
    if (keptApart(records, needed)) continue;
    const other = varietyName(group[0]!.variety);
    const distances = records.flatMap((r) => (r?.method === 'distance' ? [r.meters] : []));
    const wants = needed === null ? 'distance' : `about ${metres(needed)}`;
    const head = `${plant.label} (${varietyName(plant.variety)}) and ${other} of ${species.commonName} grew in ${plant.season}`;
    const message =
      distances.length > 0
        ? `${head} only ${metres(Math.max(...distances))} apart: ${species.commonName} ${HOW[pollination]} and needs ${wants} between varieties for seed to come true, so this seed may be crossed.`
        : `${head} with no isolation recorded: ${species.commonName} ${HOW[pollination]} and needs ${wants} between varieties, flowering staggered in time, or bagged or caged flowers, or the seed may be crossed. Record how they were kept apart, or grow the seed out and look for off-types.`;
    out.push({ kind: 'isolation', message: `${message} ${LOCAL_ADVICE}` });
  }
  return out;
}
