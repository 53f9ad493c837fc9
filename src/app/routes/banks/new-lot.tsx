import { useState } from 'react';
import type { ParentPlantDto } from '#shared/schemas/lots';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { Dialog } from '#src/components/ui/dialog';
import { FormAlert } from '#src/components/ui/form-alert';
import { PageHeader } from '#src/components/ui/page-header';
import { Loading } from '#src/components/ui/spinner';
import { paths } from '#src/config/paths';
import { NewLotForm } from '#src/features/lots/components/new-lot-form';
import { isRetryable, uploadFailureMessage, useUploadPhoto } from '#src/features/photos/api/upload-photo';
import { usePlants } from '#src/features/plants/api/get-plants';
import { PlantForm } from '#src/features/plants/components/plant-form';
import { useSpecies } from '#src/features/species/api/get-species';
import { NewSpeciesForm } from '#src/features/species/components/new-species-form';
import { SpeciesCautions } from '#src/features/species/components/species-cautions';
import { TraitList } from '#src/features/species/components/trait-list';
import { todayIn } from '#src/lib/dates';
import type { LotPageState } from './lot';
import { useRouteBank } from './use-route-bank';

export function NewLotPage() {
  const { bank, role } = useRouteBank();
  const navigate = useNavigate();
  const upload = useUploadPhoto(bank.id);
  const species = useSpecies(bank.id);
  const plants = usePlants(bank.id);
  const [addingPlant, setAddingPlant] = useState<{ speciesId: string | undefined } | null>(null);
  const [addedPlantId, setAddedPlantId] = useState<string>();
  const [addingSpecies, setAddingSpecies] = useState(false);
  const [addedSpeciesId, setAddedSpeciesId] = useState<string>();
  const today = todayIn(bank.timeZone);
  const [search] = useSearchParams();
  const initial = grownFromStart(plants.data ?? [], search.get('grownFrom'));

  if (role === 'viewer') {
    return (
      <>
        <PageHeader eyebrow={bank.name} title="New lot" />
        <FormAlert tone="info">
          As a viewer you can read this bank’s lots but not add them.{' '}
          <Link to={paths.lots.getHref(bank.id)} className="underline">
            Back to the lots
          </Link>
        </FormAlert>
      </>
    );
  }

  return (
    <div className="mx-auto w-full max-w-3xl">
      <PageHeader
        eyebrow={
          <Link to={paths.lots.getHref(bank.id)} className="underline">
            {bank.name} · Lots
          </Link>
        }
        title="New lot"
        description="What is in the packet, where it came from, and how much. Only the species, variety, origin and date are needed."
      />
      {species.isPending || plants.isPending ? (
        <Loading label="Loading the species" />
      ) : species.isError ? (
        <FormAlert>{species.error.message}</FormAlert>
      ) : (
        <NewLotForm
          bankId={bank.id}
          species={species.data}
          plants={plants.data ?? []}
          today={today}
          initial={initial}
          renderSpeciesNote={(s) => (
            <div className="grid gap-3 rounded-lg bg-husk-50 p-3">
              <SpeciesCautions species={s} />
              <TraitList species={s} compact />
            </div>
          )}
          onAddPlant={(speciesId) => setAddingPlant({ speciesId })}
          addedPlantId={addedPlantId}
          onAddSpecies={() => setAddingSpecies(true)}
          addedSpeciesId={addedSpeciesId}
          onCreated={async (lot, photo, onPhotoProgress) => {
            const state: LotPageState = { notice: `Lot ${lot.code} is saved.` };
            if (photo) {
              try {
                await upload.mutateAsync({
                  subject: 'lot',
                  subjectId: lot.id,
                  file: photo,
                  onProgress: onPhotoProgress,
                });
              } catch (error) {
                // The lot is saved either way; its page says what went wrong and offers a retry.
                state.photoFailure = {
                  file: photo,
                  message: uploadFailureMessage(error),
                  retryable: isRetryable(error),
                };
              }
            }
            await navigate(paths.lot.getHref(bank.id, lot.id), { state });
          }}
        />
      )}

      <Dialog open={addingSpecies} title="Add a species" onClose={() => setAddingSpecies(false)}>
        {addingSpecies ? (
          <NewSpeciesForm
            bankId={bank.id}
            onCancel={() => setAddingSpecies(false)}
            onCreated={(added) => {
              setAddedSpeciesId(added.id);
              setAddingSpecies(false);
            }}
          />
        ) : null}
      </Dialog>

      <Dialog open={addingPlant !== null} title="Add a parent plant" onClose={() => setAddingPlant(null)}>
        {addingPlant && species.data ? (
          <PlantForm
            bankId={bank.id}
            species={species.data}
            initialSpeciesId={addingPlant.speciesId}
            season={Number(today.slice(0, 4))}
            onCancel={() => setAddingPlant(null)}
            onCreated={async (plant, photo, onPhotoProgress) => {
              if (photo) {
                await upload
                  .mutateAsync({
                    subject: 'plant',
                    subjectId: plant.id,
                    file: photo,
                    onProgress: onPhotoProgress,
                  })
                  .catch(
                    () => undefined, // the plant is saved; a photo can be added on the plants page
                  );
              }
              setAddedPlantId(plant.id);
              setAddingPlant(null);
            }}
          />
        ) : null}
      </Dialog>
    </div>
  );
}

/**
 * Generations: `?grownFrom=<lotId>` (from "Keep plants for seed" on the planner) starts the form with
 * the plants grown from that lot in their latest season ticked, and their species and variety.
 */
function grownFromStart(plants: ParentPlantDto[], lotId: string | null) {
  const grown = lotId ? plants.filter((p) => p.grownFromLotId === lotId) : [];
  if (grown.length === 0) return undefined;
  const season = Math.max(...grown.map((p) => p.season ?? 0));
  const latest = grown.filter((p) => (p.season ?? 0) === season);
  return {
    speciesId: latest[0]!.speciesId,
    variety: latest[0]!.variety ?? '',
    parentPlantIds: latest.map((p) => p.id),
  };
}
