import type { ReactNode } from 'react';
import { useController, useFormContext, useWatch } from 'react-hook-form';
import type { z } from 'zod';
import type { ParentPlantDto, updateLotBodySchema } from '#shared/schemas/lots';
import { SelectField } from '#src/components/ui/select-field';
import { TextAreaField } from '#src/components/ui/text-area-field';
import { TextField, type TextFieldProps } from '#src/components/ui/text-field';
import { storageLabels, type StoragePlace } from './lot-format';
import {
  emptyToNull,
  numberOrNull,
  ParentPlantPicker,
  SwapCaution,
  TreatedCaution,
  TreatedCheckbox,
} from './lot-form-parts';

/*
 * The fields a lot has in both the new-lot form and the edit form, each bound to the form around it
 * (react-hook-form's FormProvider) under the same name, with the same label, parsing and messages.
 * The forms lay them out their own way; props only add what one form says more (a hint, a limit).
 */

/** The fields both forms share (the edit form's body; the new-lot form adds species and quantity). */
type LotFormFields = z.input<typeof updateLotBodySchema>;

const useLotForm = () => useFormContext<LotFormFields>();

/** What a form may add to a shared text field: a hint, a limit, its place in the layout. */
type Extra = Omit<TextFieldProps, 'label' | 'error' | 'name' | 'onChange' | 'onBlur' | 'ref' | 'value'>;

const PLACES: readonly StoragePlace[] = ['room', 'fridge', 'freezer', 'other'];

export function VarietyField(extra: Extra) {
  const { register, formState } = useLotForm();
  return (
    <TextField
      label="Variety"
      autoComplete="off"
      error={formState.errors.variety?.message}
      {...extra}
      {...register('variety')}
    />
  );
}

/** The lot's own code; `blankLeavesOut` when an empty box lets Hilum make one (new lots). */
export function LotCodeField({ blankLeavesOut = false, ...extra }: Extra & { blankLeavesOut?: boolean }) {
  const { register, formState } = useLotForm();
  return (
    <TextField
      label="Lot code"
      autoComplete="off"
      spellCheck={false}
      error={formState.errors.code?.message}
      {...extra}
      {...register('code', blankLeavesOut ? { setValueAs: (v: unknown) => (v === '' ? undefined : v) } : {})}
    />
  );
}

export function HarvestDateField(extra: Extra) {
  const { register, formState } = useLotForm();
  return (
    <TextField
      label="Harvest date"
      type="date"
      className="num"
      error={formState.errors.harvestDate?.message}
      {...extra}
      {...register('harvestDate', { setValueAs: emptyToNull })}
    />
  );
}

/** `showsHarvestError` where this box replaces the harvest date (one or the other is asked for). */
export function PackedForSeasonField({
  showsHarvestError = false,
  ...extra
}: Extra & { showsHarvestError?: boolean }) {
  const { register, formState } = useLotForm();
  const { errors } = formState;
  return (
    <TextField
      label="Packed for season"
      type="number"
      inputMode="numeric"
      min={1900}
      max={2100}
      className="num"
      error={errors.packedForSeason?.message ?? (showsHarvestError ? errors.harvestDate?.message : undefined)}
      {...extra}
      {...register('packedForSeason', { setValueAs: numberOrNull })}
    />
  );
}

export function PlantsBulkedField(extra: Extra) {
  const { register, formState } = useLotForm();
  return (
    <TextField
      label="Plants bulked"
      type="number"
      inputMode="numeric"
      min={1}
      step={1}
      className="num"
      error={formState.errors.plantsBulked?.message}
      {...extra}
      {...register('plantsBulked', { setValueAs: numberOrNull })}
    />
  );
}

/** The parent plants to tick: the caller passes only the lot's species' plants. */
export function ParentPlantsField({ plants }: { plants: ParentPlantDto[] }) {
  const { control } = useLotForm();
  const { field, fieldState } = useController({ control, name: 'parentPlantIds' });
  return (
    <ParentPlantPicker
      plants={plants}
      value={field.value ?? []}
      onChange={field.onChange}
      error={fieldState.error?.message}
    />
  );
}

/**
 * Where and how the seed is kept: place, location, temperature and humidity, laid out by the
 * caller. The location is "Location" under a Storage heading, "Storage location" without one.
 */
export function StorageFields({
  locationLabel,
  locationHint,
}: {
  locationLabel: string;
  locationHint?: ReactNode;
}) {
  const { register, formState } = useLotForm();
  const errors = formState.errors.storage;
  return (
    <>
      <SelectField
        label="Kept in"
        error={errors?.place?.message}
        {...register('storage.place', { setValueAs: emptyToNull })}
      >
        <option value="">Not said</option>
        {PLACES.map((place) => (
          <option key={place} value={place}>
            {storageLabels[place]}
          </option>
        ))}
      </SelectField>
      <TextField
        label={locationLabel}
        hint={locationHint}
        autoComplete="off"
        error={errors?.location?.message}
        {...register('storage.location')}
      />
      <TextField
        label="Temperature (°C)"
        type="number"
        inputMode="decimal"
        step="any"
        hint="Optional."
        className="num"
        error={errors?.temperatureC?.message}
        {...register('storage.temperatureC', { setValueAs: numberOrNull })}
      />
      <TextField
        label="Relative humidity (%)"
        hint="Optional."
        type="number"
        inputMode="decimal"
        min={0}
        max={100}
        step="any"
        className="num"
        error={errors?.humidityPct?.message}
        {...register('storage.humidityPct', { setValueAs: numberOrNull })}
      />
    </>
  );
}

/** The swap caution for a swapped lot, the "treated seed" box, and its caution once ticked. */
export function TreatedAndCautions() {
  const { register, control } = useLotForm();
  const origin = useWatch({ control, name: 'origin' });
  const treated = useWatch({ control, name: 'treated' });
  return (
    <>
      {origin === 'swapped' ? <SwapCaution /> : null}
      <TreatedCheckbox field={register('treated')} />
      {treated ? <TreatedCaution /> : null}
    </>
  );
}

export function LotNotesField({ id }: { id?: string }) {
  const { register, formState } = useLotForm();
  return (
    <TextAreaField id={id} label="Notes" error={formState.errors.notes?.message} {...register('notes')} />
  );
}
