import { zodResolver } from '@hookform/resolvers/zod';
import { useState, type ReactNode } from 'react';
import { FormProvider, useForm } from 'react-hook-form';
import { updateLotBodySchema, type LotDto, type ParentPlantDto } from '#shared/schemas/lots';
import { Button } from '#src/components/ui/button';
import { Card } from '#src/components/ui/card';
import { FormAlert } from '#src/components/ui/form-alert';
import { SelectField } from '#src/components/ui/select-field';
import { TextField } from '#src/components/ui/text-field';
import { isApiError } from '#src/lib/api-client';
import { formatDay } from '#src/lib/dates';
import { applyServerError } from '#src/lib/form-errors';
import { useUpdateLot } from '../api/update-lot';
import {
  HarvestDateField,
  LotCodeField,
  LotNotesField,
  PackedForSeasonField,
  ParentPlantsField,
  PlantsBulkedField,
  StorageFields,
  TreatedAndCautions,
  VarietyField,
} from './lot-fieldsets';
import {
  formatCount,
  harvestLabel,
  originLabels,
  statusLabels,
  statusOrder,
  storageLabels,
  type Origin,
} from './lot-format';
import { friendlyNumberError } from './lot-form-parts';

const resolver = zodResolver(updateLotBodySchema, { error: friendlyNumberError });
const ORIGINS: readonly Origin[] = ['saved', 'swapped', 'bought'];
const SERVER_FIELDS = [
  'code',
  'variety',
  'origin',
  'sourceName',
  'harvestDate',
  'packedForSeason',
  'plantsBulked',
  'parentPlantIds',
  'status',
  'storage.place',
  'storage.location',
  'storage.temperatureC',
  'storage.humidityPct',
  'notes',
  'treated',
] as const;

function toFormValues(lot: LotDto) {
  return {
    code: lot.code,
    variety: lot.variety,
    origin: lot.origin,
    sourceName: lot.sourceName ?? '',
    harvestDate: lot.harvestDate,
    packedForSeason: lot.packedForSeason,
    plantsBulked: lot.plantsBulked,
    parentPlantIds: lot.parentPlantIds,
    status: lot.status,
    storage: {
      place: lot.storage.place,
      location: lot.storage.location ?? '',
      temperatureC: lot.storage.temperatureC,
      humidityPct: lot.storage.humidityPct,
    },
    notes: lot.notes ?? '',
    treated: lot.treated,
  };
}

function Detail({ label, children, wide = false }: { label: string; children: ReactNode; wide?: boolean }) {
  return (
    <div className={wide ? 'min-w-0 sm:col-span-2' : 'min-w-0'}>
      <dt className="text-sm font-semibold text-loam-700">{label}</dt>
      <dd className="break-words text-loam-900">{children}</dd>
    </div>
  );
}

function storageWords(lot: LotDto): string {
  const parts = [
    lot.storage.place ? storageLabels[lot.storage.place] : null,
    lot.storage.location,
    lot.storage.temperatureC !== null ? `${lot.storage.temperatureC} °C` : null,
    lot.storage.humidityPct !== null ? `${lot.storage.humidityPct}% humidity` : null,
  ].filter(Boolean);
  return parts.length ? parts.join(' · ') : 'Not said';
}

export interface LotDetailsProps {
  bankId: string;
  lot: LotDto;
  /** This species' parent plants in the bank, for the edit form. */
  plants: ParentPlantDto[];
  canEdit: boolean;
}

/** What the grower logged about a lot, and (for growers) a form to change it. */
export function LotDetails({ bankId, lot, plants, canEdit }: LotDetailsProps) {
  const [editing, setEditing] = useState(false);
  return (
    <Card
      title="Details"
      actions={
        canEdit && !editing ? (
          <Button variant="secondary" onClick={() => setEditing(true)}>
            Edit details
          </Button>
        ) : undefined
      }
    >
      {editing ? (
        <LotEditForm bankId={bankId} lot={lot} plants={plants} onDone={() => setEditing(false)} />
      ) : (
        <dl className="grid gap-x-6 gap-y-3 sm:grid-cols-2">
          <Detail label="Origin">
            {originLabels[lot.origin]}
            {lot.sourceName ? ` · ${lot.sourceName}` : ''}
          </Detail>
          <Detail label={lot.harvestDate ? 'Harvested' : 'Season'}>{harvestLabel(lot)}</Detail>
          <Detail label="Amount">
            {lot.amount.kind === 'unknown'
              ? 'Not known'
              : lot.amount.kind === 'weighed'
                ? `Weighed${lot.gramsEntered !== null ? `: ${lot.gramsEntered} g` : ''}, turned into seeds`
                : lot.amount.kind === 'estimated'
                  ? 'Estimated (about)'
                  : 'Counted'}
          </Detail>
          <Detail label="Plants bulked">
            {lot.plantsBulked !== null ? formatCount(lot.plantsBulked) : 'Not said'}
          </Detail>
          <Detail label="Storage">{storageWords(lot)}</Detail>
          <Detail label="Seed treatment">{lot.treated ? 'Treated (coated)' : 'Not treated'}</Detail>
          <Detail label="Logged">{formatDay(lot.createdAt.slice(0, 10))}</Detail>
          {lot.notes ? (
            <Detail label="Notes" wide>
              <span className="whitespace-pre-line">{lot.notes}</span>
            </Detail>
          ) : null}
        </dl>
      )}
    </Card>
  );
}

function LotEditForm({
  bankId,
  lot,
  plants,
  onDone,
}: {
  bankId: string;
  lot: LotDto;
  plants: ParentPlantDto[];
  onDone: () => void;
}) {
  const update = useUpdateLot(bankId, lot.id);
  const [formError, setFormError] = useState<string>();
  const form = useForm({ resolver, defaultValues: toFormValues(lot) });
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = form;

  const onSubmit = handleSubmit(async (body) => {
    setFormError(undefined);
    try {
      await update.mutateAsync(body);
      onDone();
    } catch (error) {
      if (isApiError(error) && error.code === 'duplicate_code') {
        setError('code', { type: 'server', message: error.message }, { shouldFocus: true });
        return;
      }
      setFormError(applyServerError(error, setError, SERVER_FIELDS));
    }
  });

  return (
    <FormProvider {...form}>
      <form noValidate onSubmit={onSubmit} className="grid gap-4">
        <FormAlert>{formError}</FormAlert>
        <div className="grid gap-4 sm:grid-cols-2">
          <LotCodeField />
          <VarietyField />
          <SelectField label="Origin" error={errors.origin?.message} {...register('origin')}>
            {ORIGINS.map((value) => (
              <option key={value} value={value}>
                {originLabels[value]}
              </option>
            ))}
          </SelectField>
          <TextField
            label="Source"
            hint="Who it was swapped with or bought from."
            autoComplete="off"
            error={errors.sourceName?.message}
            {...register('sourceName')}
          />
          <HarvestDateField />
          <PackedForSeasonField />
          <PlantsBulkedField />
          <SelectField
            label="Status"
            hint="Used up follows the stock by itself; retire a lot you no longer sow from."
            error={errors.status?.message}
            {...register('status')}
          >
            {statusOrder.map((status) => (
              <option key={status} value={status}>
                {statusLabels[status]}
              </option>
            ))}
          </SelectField>
          <StorageFields locationLabel="Storage location" />
        </div>
        <TreatedAndCautions />
        {plants.length > 0 ? (
          <div className="grid gap-2">
            <p className="font-semibold text-loam-900">Parent plants</p>
            <ParentPlantsField plants={plants} />
          </div>
        ) : null}
        <LotNotesField />
        <div className="flex flex-wrap gap-2">
          <Button type="submit" isLoading={update.isPending}>
            Save changes
          </Button>
          <Button variant="secondary" onClick={onDone} disabled={update.isPending}>
            Cancel
          </Button>
        </div>
      </form>
    </FormProvider>
  );
}
