import { POISONOUS_SEED_DEFAULT, poisonousHandling } from '#shared/cautions';
import type { SpeciesDto } from '#shared/schemas/species';
import { Caution } from '#src/components/ui/caution';

/** The poisonous-seed caution for a flagged species; nothing for the others. */
export function SpeciesCautions({ species, foldOnPhone }: { species: SpeciesDto; foldOnPhone?: boolean }) {
  if (!species.traits.poisonous) return null;
  return (
    <Caution
      title={`Poisonous: handle ${species.commonName.toLowerCase()} seed with care`}
      foldOnPhone={foldOnPhone}
    >
      <p>{species.traits.caution ?? POISONOUS_SEED_DEFAULT}</p>
      <p className="mt-1">{poisonousHandling(species.traits.caution)}</p>
    </Caution>
  );
}
