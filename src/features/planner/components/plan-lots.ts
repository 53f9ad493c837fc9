import type { SpeciesTraits } from '#shared/schemas/species';
import type { RankingItem } from '#shared/schemas/viability';
import { formatSeeds } from './plan-format';

/** Indoors or direct to start with: what the species' traits say is usual. */
export function defaultStart(traits: SpeciesTraits): 'indoors' | 'direct' {
  if (traits.startMethod === 'direct') return 'direct';
  if (traits.startMethod === 'either' && (traits.startWeeksFrom == null || traits.startWeeksTo == null))
    return 'direct';
  return 'indoors';
}

/** The active lots of a species a sowing can come from, the likeliest to come up first. */
export function lotsOfSpecies(ranking: readonly RankingItem[], speciesId: string): RankingItem[] {
  return ranking
    .filter((r) => r.speciesId === speciesId && r.status === 'active')
    .sort((a, b) => (b.projectedPercent ?? -1) - (a.projectedPercent ?? -1) || a.code.localeCompare(b.code));
}

/** A lot to retire gives no seeds to sow, so it cannot fill a sowing (docs/decisions.md): shown, not chosen. */
export const cannotPlan = (lot: RankingItem): boolean => lot.recommendation === 'retire';

/**
 * "TOM-25-01 · Bench Red — about 87% by sowing, 480 seeds" for a lot picker; an untested lot's figure
 * is named a guess, and a lot to retire says why it cannot be chosen.
 */
export function lotChoiceLabel(lot: RankingItem): string {
  const percent = lot.projectedPercent !== null ? `${Math.round(lot.projectedPercent)}%` : null;
  const expected = cannotPlan(lot)
    ? `to retire, no seeds to sow${percent ? ` (about ${percent} by sowing)` : ''}`
    : lot.estimateOnly
      ? `not tested yet${percent ? `, a guess of about ${percent}` : ''}`
      : percent
        ? `about ${percent} by sowing`
        : 'no estimate';
  const stock = lot.seedsOnHand === null ? 'amount not known' : `${formatSeeds(lot.seedsOnHand)} seeds`;
  return `${lot.code} · ${lot.variety} — ${expected}, ${stock}`;
}
