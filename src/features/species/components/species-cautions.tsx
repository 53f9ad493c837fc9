import type { SpeciesDto } from '#shared/schemas/species';
import { Caution } from '#src/components/ui/caution';

const DEFAULT_POISON_NOTE =
  'Seed or plants of this species are harmful if eaten. Keep seed and plants away from children and pets.';

/** The poisonous-seed caution for a flagged species; nothing for the others. */
export function SpeciesCautions({ species, foldOnPhone }: { species: SpeciesDto; foldOnPhone?: boolean }) {
  if (!species.traits.poisonous) return null;
  return (
    <Caution
      title={`Poisonous: handle ${species.commonName.toLowerCase()} seed with care`}
      foldOnPhone={foldOnPhone}
    >
      <p>{species.traits.caution ?? DEFAULT_POISON_NOTE}</p>
      <p className="mt-1">
        Wash your hands after handling the seed, and keep packets out of reach.
        {/poison cent/i.test(species.traits.caution ?? '')
          ? null
          : ' If any is swallowed, follow the advice of your local poison centre or doctor.'}
      </p>
    </Caution>
  );
}
