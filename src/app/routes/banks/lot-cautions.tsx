import type { LotDto } from '#shared/schemas/lots';
import type { SpeciesDto } from '#shared/schemas/species';
import { Caution } from '#src/components/ui/caution';
import { LotCautions } from '#src/features/lots/components/lot-cautions';
import { SpeciesCautions } from '#src/features/species/components/species-cautions';

/**
 * Everything on a lot's page that can hurt someone, at the top where a phone shows it first:
 * treated seed and swaps (from the lot), poisonous seed (from its species). On a phone each shows its
 * title, and opens its text with a tap, so the lot's advice still starts in the first screen.
 */
export function LotPageCautions({ lot, species }: { lot: LotDto; species: SpeciesDto | undefined }) {
  const poisonous = species?.traits.poisonous === true;
  // Generations: the server's caution for seed saved from an F1 hybrid parent.
  const lineCautions = lot.lineage?.cautions ?? [];
  if (!lot.treated && lot.origin !== 'swapped' && !poisonous && lineCautions.length === 0) return null;
  return (
    <div className="mb-4 grid gap-2 sm:mb-6" aria-label="Cautions for this lot" role="group">
      <LotCautions lot={lot} foldOnPhone />
      {lineCautions.map((text) => (
        <Caution key={text} title="Saved from an F1 hybrid" foldOnPhone>
          {text}
        </Caution>
      ))}
      {species ? <SpeciesCautions species={species} foldOnPhone /> : null}
    </div>
  );
}
