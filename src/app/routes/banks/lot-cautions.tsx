import type { LotDto } from '#shared/schemas/lots';
import type { SpeciesDto } from '#shared/schemas/species';
import { LotCautions } from '#src/features/lots/components/lot-cautions';
import { SpeciesCautions } from '#src/features/species/components/species-cautions';

/**
 * Everything on a lot's page that can hurt someone, at the top where a phone shows it first:
 * treated seed and swaps (from the lot), poisonous seed (from its species).
 */
export function LotPageCautions({ lot, species }: { lot: LotDto; species: SpeciesDto | undefined }) {
  const poisonous = species?.traits.poisonous === true;
  if (!lot.treated && lot.origin !== 'swapped' && !poisonous) return null;
  return (
    <div className="mb-6 grid gap-2" aria-label="Cautions for this lot" role="group">
      <LotCautions lot={lot} />
      {species ? <SpeciesCautions species={species} /> : null}
    </div>
  );
}
