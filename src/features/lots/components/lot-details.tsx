import { zodResolver } from '@hookform/resolvers/zod';
import { useState, type ReactNode } from 'react';
import { useController, useForm, useWatch } from 'react-hook-form';
import { updateLotBodySchema, type LotDto, type ParentPlantDto } from '../../../../shared/schemas/lots';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { FormAlert } from '../../../components/ui/form-alert';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { isApiError } from '../../../lib/api-client';
import { formatDay } from '../../../lib/dates';
import { applyServerError } from '../../../lib/form-errors';
import { useUpdateLot } from '../api/update-lot';
import {
  formatCount,
  harvestLabel,
  originLabels,
  statusLabels,
  statusOrder,
  storageLabels,
  type Origin,
  type StoragePlace,
} from './lot-format';
import {
  emptyToNull,
  friendlyNumberError,
  numberOrNull,
  ParentPlantPicker,
  SwapCaution,
  TreatedCaution,
  TreatedCheckbox,
} from './lot-form-parts';

const resolver = zodResolver(updateLotBodySchema, { error: friendlyNumberError });
const ORIGINS: readonly Origin[] = ['saved', 'swapped', 'bought'];
const PLACES: readonly StoragePlace[] = ['room', 'fridge', 'freezer', 'other'];
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
          <Detail label="Quantity when logged">
            {lot.gramsEntered !== null
              ? `${lot.gramsEntered} g, estimated through seeds per gram`
              : lot.quantityEstimated
                ? 'Estimated'
                : 'Counted'}
          </Detail>
          <Detail label="Plants bulked">{lot.plantsBulked !== null ? formatCount(lot.plantsBulked) : 'Not said'}</Detail>
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

function LotEditForm({ bankId, lot, plants, onDone }: { bankId: string; lot: LotDto; plants: ParentPlantDto[]; onDone: () => void }) {
  const update = useUpdateLot(bankId, lot.id);
  const [formError, setFormError] = useState<string>();
  const {
    register,
    control,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm({ resolver, defaultValues: toFormValues(lot) });
  const parents = useController({ control, name: 'parentPlantIds' });
  const origin = useWatch({ control, name: 'origin' });
  const treated = useWatch({ control, name: 'treated' });

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
    <form noValidate onSubmit={onSubmit} className="grid gap-4">
      <FormAlert>{formError}</FormAlert>
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Lot code" autoComplete="off" spellCheck={false} error={errors.code?.message} {...register('code')} />
        <TextField label="Variety" autoComplete="off" error={errors.variety?.message} {...register('variety')} />
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
        <TextField
          label="Harvest date"
          type="date"
          className="num"
          error={errors.harvestDate?.message}
          {...register('harvestDate', { setValueAs: emptyToNull })}
        />
        <TextField
          label="Packed for season"
          type="number"
          inputMode="numeric"
          className="num"
          error={errors.packedForSeason?.message}
          {...register('packedForSeason', { setValueAs: numberOrNull })}
        />
        <TextField
          label="Plants bulked"
          type="number"
          inputMode="numeric"
          min={1}
          className="num"
          error={errors.plantsBulked?.message}
          {...register('plantsBulked', { setValueAs: numberOrNull })}
        />
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
        <SelectField label="Kept in" error={errors.storage?.place?.message} {...register('storage.place', { setValueAs: emptyToNull })}>
          <option value="">Not said</option>
          {PLACES.map((place) => (
            <option key={place} value={place}>
              {storageLabels[place]}
            </option>
          ))}
        </SelectField>
        <TextField label="Storage location" autoComplete="off" error={errors.storage?.location?.message} {...register('storage.location')} />
        <TextField
          label="Temperature (°C)"
          type="number"
          inputMode="decimal"
          step="any"
          className="num"
          error={errors.storage?.temperatureC?.message}
          {...register('storage.temperatureC', { setValueAs: numberOrNull })}
        />
        <TextField
          label="Relative humidity (%)"
          type="number"
          inputMode="decimal"
          step="any"
          className="num"
          error={errors.storage?.humidityPct?.message}
          {...register('storage.humidityPct', { setValueAs: numberOrNull })}
        />
      </div>
      {origin === 'swapped' ? <SwapCaution /> : null}
      <TreatedCheckbox field={register('treated')} />
      {treated ? <TreatedCaution /> : null}
      {plants.length > 0 ? (
        <div className="grid gap-2">
          <p className="font-semibold text-loam-900">Parent plants</p>
          <ParentPlantPicker
            plants={plants}
            value={parents.field.value ?? []}
            onChange={parents.field.onChange}
            error={errors.parentPlantIds?.message}
          />
        </div>
      ) : null}
      <div className="flex flex-col gap-1">
        <label htmlFor={`notes-${lot.id}`} className="font-semibold text-loam-900">
          Notes
        </label>
        <textarea
          id={`notes-${lot.id}`}
          rows={3}
          className="w-full rounded-lg border border-loam-300 bg-white px-3 py-2 text-base text-loam-900"
          {...register('notes')}
        />
      </div>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" isLoading={update.isPending}>
          Save changes
        </Button>
        <Button variant="secondary" onClick={onDone} disabled={update.isPending}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
