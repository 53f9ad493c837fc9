import type { SpeciesTraits } from '#shared/schemas/species';
import { HYBRID_SEED } from '#shared/cautions';

// Seed-saving guidance, common practice among seed savers (no single published source).
export { HYBRID_SEED as HYBRID_CAUTION } from '#shared/cautions';
export const OUTCROSSING_CAUTION =
  'This species is cross-pollinated by insects or wind: grow one variety at a time, separate varieties by distance, or bag or cage the flowers, or the seed may not come true. Save from many plants to keep the variety vigorous.';
export const MIXED_CAUTION =
  'This species mostly self-pollinates but crosses now and then: a few metres between varieties, or a barrier crop, keeps the seed true.';

export function plantCautions(hybrid: boolean, traits: SpeciesTraits): string[] {
  const out: string[] = [];
  if (hybrid) out.push(HYBRID_SEED);
  if (traits.outcrossing === 'cross') out.push(OUTCROSSING_CAUTION);
  if (traits.outcrossing === 'mixed') out.push(MIXED_CAUTION);
  if (traits.poisonous && traits.caution) out.push(traits.caution);
  return out;
}
