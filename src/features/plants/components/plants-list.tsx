import { useState } from 'react';
import type { ParentPlantDto } from '#shared/schemas/lots';
import { Button } from '#src/components/ui/button';
import { ConfirmDialog } from '#src/components/ui/confirm-dialog';
import { Link } from 'react-router-dom';
import { paths } from '#src/config/paths';
import { useDeletePlant } from '../api/delete-plant';
import { PlantCautions } from './plant-cautions';
import { IsolationEditor, SeedSavingWarnings, isolationWords } from './isolation';

export interface PlantsListProps {
  bankId: string;
  plants: ParentPlantDto[];
  canEdit: boolean;
  /** A title for the list's screen-reader name. */
  label?: string;
  /** Show each plant's keeping-true warnings (a lot page shows its own, for the lot). */
  showWarnings?: boolean;
}

/** Parent plants with their photo, details and seed-saving cautions; growers delete. */
export function PlantsList({
  bankId,
  plants,
  canEdit,
  label = 'Parent plants',
  showWarnings = false,
}: PlantsListProps) {
  const remove = useDeletePlant(bankId);
  const [pending, setPending] = useState<ParentPlantDto | null>(null);
  return (
    <>
      <ul aria-label={label} className="divide-y divide-loam-100">
        {plants.map((plant) => {
          const photo = plant.photos[0];
          return (
            <li key={plant.id} className="flex gap-3 py-3">
              {photo ? (
                <img
                  src={photo.thumbUrl}
                  alt={`Photo of ${plant.label}`}
                  loading="lazy"
                  className="size-16 shrink-0 rounded-lg border border-loam-200 object-cover"
                />
              ) : null}
              <div className="grid min-w-0 flex-1 gap-1">
                <div className="flex flex-wrap items-start justify-between gap-2">
                  <div className="min-w-0">
                    <p className="font-bold text-loam-900">{plant.label}</p>
                    <p className="text-sm text-loam-700">
                      {[
                        plant.speciesName,
                        plant.variety,
                        plant.location,
                        plant.season,
                        plant.hybrid ? 'F1 hybrid' : null,
                        isolationWords(plant.isolation),
                      ]
                        .filter(Boolean)
                        .join(' · ')}
                    </p>
                  </div>
                  {canEdit ? (
                    <Button
                      variant="quiet"
                      aria-label={`Delete ${plant.label}`}
                      onClick={() => {
                        remove.reset();
                        setPending(plant);
                      }}
                    >
                      Delete
                    </Button>
                  ) : null}
                </div>
                {plant.grownFromLotId && plant.grownFromLotCode ? (
                  <p className="text-sm text-loam-700">
                    Grown from{' '}
                    <Link
                      to={paths.lot.getHref(bankId, plant.grownFromLotId)}
                      className="font-semibold text-moss-800 underline"
                    >
                      {plant.grownFromLotCode}
                    </Link>
                  </p>
                ) : null}
                {plant.notes ? (
                  <p className="whitespace-pre-line text-sm text-loam-800">{plant.notes}</p>
                ) : null}
                <PlantCautions plant={plant} />
                {showWarnings ? (
                  <SeedSavingWarnings warnings={plant.warnings} label={`Warnings for ${plant.label}`} />
                ) : null}
                {canEdit ? <IsolationEditor bankId={bankId} plant={plant} /> : null}
              </div>
            </li>
          );
        })}
      </ul>
      <ConfirmDialog
        open={pending !== null}
        title={pending ? `Delete ${pending.label}?` : ''}
        confirmLabel="Delete plant"
        destructive
        isPending={remove.isPending}
        error={remove.error?.message}
        onCancel={() => setPending(null)}
        onConfirm={() => pending && remove.mutate(pending.id, { onSuccess: () => setPending(null) })}
      >
        Lots saved from it keep their seed and history; they just no longer name this plant as a parent.
      </ConfirmDialog>
    </>
  );
}
