import { useState } from 'react';
import { Card } from '#src/components/ui/card';
import { EmptyState } from '#src/components/ui/empty-state';
import { FormAlert } from '#src/components/ui/form-alert';
import { PageHeader } from '#src/components/ui/page-header';
import { Loading } from '#src/components/ui/spinner';
import { uploadFailureMessage, useUploadPhoto } from '#src/features/photos/api/upload-photo';
import { usePlants } from '#src/features/plants/api/get-plants';
import { PlantForm } from '#src/features/plants/components/plant-form';
import { PlantsList } from '#src/features/plants/components/plants-list';
import { useSpecies } from '#src/features/species/api/get-species';
import { todayIn } from '#src/lib/dates';
import { LotsSubnav } from './lots-subnav';
import { useRouteBank } from './use-route-bank';

export function PlantsPage() {
  const { bank, role } = useRouteBank();
  const canEdit = role !== 'viewer';
  const plants = usePlants(bank.id);
  const species = useSpecies(bank.id);
  const upload = useUploadPhoto(bank.id);
  const [photoError, setPhotoError] = useState<string>();
  const season = Number(todayIn(bank.timeZone).slice(0, 4));

  return (
    <>
      <PageHeader
        eyebrow={bank.name}
        title="Parent plants"
        description="The plants and rows seed is saved from. A lot can name its parents, so you can follow a line from year to year."
      />
      <LotsSubnav bankId={bank.id} />
      <div className="grid items-start gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <Card
          title="Plants in this bank"
          description={plants.data ? `${plants.data.length} recorded` : undefined}
        >
          {plants.isPending ? (
            <Loading label="Loading the plants" />
          ) : plants.isError ? (
            <FormAlert>{plants.error.message}</FormAlert>
          ) : plants.data.length === 0 ? (
            <EmptyState
              title="No parent plants yet"
              description={
                canEdit
                  ? 'When you mark plants to save seed from, add them here: a label, the species and where they grow.'
                  : 'Growers in this bank add the plants they save seed from.'
              }
            />
          ) : (
            <PlantsList bankId={bank.id} plants={plants.data} canEdit={canEdit} showWarnings />
          )}
        </Card>
        {canEdit && species.data ? (
          <Card title="Add a parent plant">
            <FormAlert>{photoError}</FormAlert>
            <PlantForm
              bankId={bank.id}
              species={species.data}
              season={season}
              onCreated={async (plant, photo, onPhotoProgress) => {
                setPhotoError(undefined);
                if (!photo) return;
                try {
                  await upload.mutateAsync({
                    subject: 'plant',
                    subjectId: plant.id,
                    file: photo,
                    onProgress: onPhotoProgress,
                  });
                } catch (error) {
                  setPhotoError(
                    `${plant.label} is saved, but its photo is not. ${uploadFailureMessage(error)}`,
                  );
                }
              }}
            />
          </Card>
        ) : null}
      </div>
    </>
  );
}
