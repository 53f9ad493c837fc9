import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useMemo, useState, type ReactNode } from 'react';
import { Controller, useController, useForm, useWatch } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { createLotBodySchema, type LotDto, type ParentPlantDto } from '../../../../shared/schemas/lots';
import type { SpeciesDto } from '../../../../shared/schemas/species';
import { Button } from '../../../components/ui/button';
import { Combobox } from '../../../components/ui/combobox';
import { FormAlert } from '../../../components/ui/form-alert';
import { PhotoPicker } from '../../../components/ui/photo-picker';
import { ProgressBar } from '../../../components/ui/progress-bar';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { paths } from '../../../config/paths';
import { isApiError } from '../../../lib/api-client';
import { applyServerError } from '../../../lib/form-errors';
import { useCreateLot } from '../api/create-lot';
import { formatCount, originHints, originLabels, storageLabels, type Origin, type StoragePlace } from './lot-format';
import {
  ChoiceCard,
  emptyToNull,
  Fieldset,
  friendlyNumberError,
  numberOrNull,
  numberOrUndefined,
  ParentPlantPicker,
  SwapCaution,
  TreatedCaution,
  TreatedCheckbox,
} from './lot-form-parts';

const resolver = zodResolver(createLotBodySchema, { error: friendlyNumberError });

const ORIGINS: readonly Origin[] = ['saved', 'swapped', 'bought'];
const PLACES: readonly StoragePlace[] = ['room', 'fridge', 'freezer', 'other'];

// Every field the server may name in a 400, so its messages land beside the right box.
const SERVER_FIELDS = [
  'speciesId',
  'variety',
  'origin',
  'sourceName',
  'harvestDate',
  'packedForSeason',
  'seedCount',
  'grams',
  'parentPlantIds',
  'plantsBulked',
  'storage.place',
  'storage.location',
  'storage.temperatureC',
  'storage.humidityPct',
  'notes',
  'code',
  'treated',
] as const;

export interface NewLotFormProps {
  bankId: string;
  species: SpeciesDto[];
  plants: ParentPlantDto[];
  /** Today in the bank's time zone: the harvest date to start from. */
  today: string;
  /** Notes under the chosen species (its cautions and bench traits). */
  renderSpeciesNote?: (species: SpeciesDto) => ReactNode;
  /** Opens a way to add a parent plant of the chosen species without leaving the form. */
  onAddPlant?: (speciesId: string | undefined) => void;
  /** A plant just added that way, ticked for the lot. */
  addedPlantId?: string | undefined;
  /** Opens a way to add a species the list lacks without leaving the form. */
  onAddSpecies?: () => void;
  /** A species just added that way, chosen for the lot. */
  addedSpeciesId?: string | undefined;
  /** After the lot is saved: upload the photo (reporting progress) and move on. */
  onCreated: (lot: LotDto, photo: File | null, onPhotoProgress: (fraction: number) => void) => Promise<void>;
}

export function NewLotForm({
  bankId,
  species,
  plants,
  today,
  renderSpeciesNote,
  onAddPlant,
  addedPlantId,
  onAddSpecies,
  addedSpeciesId,
  onCreated,
}: NewLotFormProps) {
  const create = useCreateLot(bankId);
  const [formError, setFormError] = useState<string>();
  const [dateKind, setDateKind] = useState<'harvest' | 'season'>('harvest');
  const [quantityKind, setQuantityKind] = useState<'count' | 'grams'>('count');
  const [photo, setPhoto] = useState<File | null>(null);
  const [phase, setPhase] = useState<'saving' | 'uploading' | null>(null);
  const [photoProgress, setPhotoProgress] = useState(0);

  const {
    register,
    control,
    handleSubmit,
    setError,
    setValue,
    getValues,
    formState: { errors, isSubmitting },
  } = useForm({
    resolver,
    defaultValues: {
      speciesId: '',
      variety: '',
      origin: 'saved' as Origin,
      sourceName: '',
      harvestDate: today,
      packedForSeason: null,
      seedCount: undefined,
      grams: undefined,
      parentPlantIds: [],
      plantsBulked: null,
      storage: { place: null, location: '', temperatureC: null, humidityPct: null },
      notes: '',
      code: undefined,
      treated: false,
    },
  });

  const parentsField = useController({ control, name: 'parentPlantIds' });
  const speciesId = useWatch({ control, name: 'speciesId' });
  const origin = useWatch({ control, name: 'origin' });
  const grams = useWatch({ control, name: 'grams' });
  const treated = useWatch({ control, name: 'treated' });
  const chosen = species.find((s) => s.id === speciesId);
  const perGram = chosen?.traits.seedsPerGram ?? null;
  const speciesPlants = useMemo(() => plants.filter((p) => p.speciesId === speciesId), [plants, speciesId]);
  const options = useMemo(
    () => species.map((s) => ({ value: s.id, label: s.commonName, description: s.scientificName })),
    [species],
  );

  // A species added from this form is chosen as soon as it shows up in the list.
  useEffect(() => {
    if (addedSpeciesId && species.some((s) => s.id === addedSpeciesId)) setValue('speciesId', addedSpeciesId, { shouldValidate: true });
  }, [addedSpeciesId, species, setValue]);

  // A parent plant added from this form is ticked as soon as it shows up in the list.
  useEffect(() => {
    if (!addedPlantId || !plants.some((p) => p.id === addedPlantId)) return;
    const current = getValues('parentPlantIds') ?? [];
    if (!current.includes(addedPlantId)) setValue('parentPlantIds', [...current, addedPlantId]);
  }, [addedPlantId, plants, getValues, setValue]);

  const onSubmit = handleSubmit(async (body) => {
    setFormError(undefined);
    setPhase('saving');
    let lot: LotDto;
    try {
      lot = await create.mutateAsync(body);
    } catch (error) {
      setPhase(null);
      if (isApiError(error) && error.code === 'duplicate_code') {
        setError('code', { type: 'server', message: error.message }, { shouldFocus: true });
        return;
      }
      setFormError(applyServerError(error, setError, SERVER_FIELDS));
      return;
    }
    if (photo) {
      setPhase('uploading');
      setPhotoProgress(0);
    }
    await onCreated(lot, photo, setPhotoProgress);
  });

  const busy = isSubmitting || phase !== null;

  return (
    <form noValidate onSubmit={onSubmit} className="grid gap-5">
      <FormAlert>{formError}</FormAlert>

      <Fieldset legend="Seed">
        <Controller
          control={control}
          name="speciesId"
          render={({ field, fieldState }) => (
            <Combobox
              label="Species"
              hint="Type part of the common or scientific name."
              placeholder="e.g. tomato or Solanum"
              required
              options={options}
              value={field.value}
              ref={field.ref}
              name={field.name}
              onBlur={field.onBlur}
              onChange={(next) => {
                field.onChange(next);
                // Parent plants belong to one species: drop the ticks that no longer fit.
                const keep = (getValues('parentPlantIds') ?? []).filter((id) =>
                  plants.some((p) => p.id === id && p.speciesId === next),
                );
                setValue('parentPlantIds', keep);
              }}
              error={fieldState.error ? 'Choose a species from the list.' : undefined}
            />
          )}
        />
        {onAddSpecies ? (
          <p className="-mt-2 text-sm text-loam-700">
            Not in the list?{' '}
            <button type="button" onClick={onAddSpecies} className="font-semibold text-moss-800 underline">
              Add a species
            </button>
          </p>
        ) : null}
        {chosen && renderSpeciesNote ? renderSpeciesNote(chosen) : null}
        <TextField
          label="Variety"
          hint="As on the packet or your label; “unknown” is fine."
          required
          autoComplete="off"
          error={errors.variety?.message}
          {...register('variety')}
        />
      </Fieldset>

      <Fieldset legend="Where it came from">
        <div role="radiogroup" aria-label="Origin" className="grid gap-2 sm:grid-cols-3">
          {ORIGINS.map((value) => (
            <ChoiceCard
              key={value}
              name="origin"
              value={value}
              checked={origin === value}
              onChange={() => {
                setValue('origin', value, { shouldDirty: true });
                if (value === 'bought' && dateKind === 'harvest') {
                  setDateKind('season');
                  setValue('harvestDate', null);
                  setValue('packedForSeason', Number(today.slice(0, 4)));
                }
              }}
              label={originLabels[value]}
              hint={originHints[value]}
            />
          ))}
        </div>
        {origin === 'swapped' || origin === 'bought' ? (
          <TextField
            label={origin === 'swapped' ? 'Swapped with' : 'Bought from'}
            hint={origin === 'swapped' ? 'The grower, circle or seed library.' : 'The seller.'}
            autoComplete="off"
            error={errors.sourceName?.message}
            {...register('sourceName')}
          />
        ) : null}
        {origin === 'swapped' ? <SwapCaution /> : null}
        <TreatedCheckbox field={register('treated')} />
        {treated ? <TreatedCaution /> : null}
      </Fieldset>

      <Fieldset legend="When">
        <div role="radiogroup" aria-label="Dated by" className="grid gap-2 sm:grid-cols-2">
          <ChoiceCard
            name="dateKind"
            value="harvest"
            checked={dateKind === 'harvest'}
            onChange={() => {
              setDateKind('harvest');
              setValue('packedForSeason', null);
              setValue('harvestDate', today);
            }}
            label="Harvest date"
            hint="When the seed was gathered"
          />
          <ChoiceCard
            name="dateKind"
            value="season"
            checked={dateKind === 'season'}
            onChange={() => {
              setDateKind('season');
              setValue('harvestDate', null);
              setValue('packedForSeason', Number(today.slice(0, 4)));
            }}
            label="Packed for season"
            hint="The year printed on a bought packet"
          />
        </div>
        {dateKind === 'harvest' ? (
          <TextField
            label="Harvest date"
            type="date"
            max={today}
            className="num"
            error={errors.harvestDate?.message}
            {...register('harvestDate', { setValueAs: emptyToNull })}
          />
        ) : (
          <TextField
            label="Packed for season"
            type="number"
            inputMode="numeric"
            min={1900}
            max={2100}
            className="num"
            error={errors.packedForSeason?.message ?? errors.harvestDate?.message}
            {...register('packedForSeason', { setValueAs: numberOrNull })}
          />
        )}
      </Fieldset>

      <Fieldset legend="How much">
        <div role="radiogroup" aria-label="Quantity as" className="grid grid-cols-2 gap-2">
          <ChoiceCard
            name="quantityKind"
            value="count"
            checked={quantityKind === 'count'}
            onChange={() => {
              setQuantityKind('count');
              setValue('grams', undefined);
            }}
            label="Seed count"
          />
          <ChoiceCard
            name="quantityKind"
            value="grams"
            checked={quantityKind === 'grams'}
            onChange={() => {
              setQuantityKind('grams');
              setValue('seedCount', undefined);
            }}
            label="Weight in grams"
          />
        </div>
        {quantityKind === 'count' ? (
          <TextField
            label="Number of seeds"
            type="number"
            inputMode="numeric"
            min={0}
            step={1}
            className="num"
            error={errors.seedCount?.message}
            {...register('seedCount', { setValueAs: numberOrUndefined })}
          />
        ) : (
          <>
            <TextField
              label="Grams"
              type="number"
              inputMode="decimal"
              min={0}
              step="any"
              className="num"
              error={errors.grams?.message}
              {...register('grams', { setValueAs: numberOrUndefined })}
            />
            <GramsEstimate grams={grams} perGram={perGram} speciesName={chosen?.commonName} />
          </>
        )}
      </Fieldset>

      <Fieldset legend="Parent plants">
        {!speciesId ? (
          <p className="text-loam-700">Choose the species first to list its parent plants.</p>
        ) : speciesPlants.length === 0 ? (
          <p className="text-loam-700">No parent plants of {chosen?.commonName.toLowerCase() ?? 'this species'} yet.</p>
        ) : (
          <ParentPlantPicker
            plants={speciesPlants}
            value={parentsField.field.value ?? []}
            onChange={parentsField.field.onChange}
            error={errors.parentPlantIds?.message}
          />
        )}
        <div className="flex flex-wrap gap-2">
          {onAddPlant ? (
            <Button variant="secondary" onClick={() => onAddPlant(speciesId || undefined)}>
              Add a parent plant
            </Button>
          ) : (
            <Link to={paths.plants.getHref(bankId)} className="min-h-11 font-semibold text-moss-800 underline">
              Add a parent plant
            </Link>
          )}
        </div>
        <TextField
          label="Plants bulked"
          hint="How many plants the seed was gathered from. Cross-pollinating crops keep their vigour with many."
          type="number"
          inputMode="numeric"
          min={1}
          step={1}
          className="num sm:max-w-48"
          error={errors.plantsBulked?.message}
          {...register('plantsBulked', { setValueAs: numberOrNull })}
        />
      </Fieldset>

      <Fieldset legend="Storage">
        <div className="grid gap-4 sm:grid-cols-2">
          <SelectField
            label="Kept in"
            error={errors.storage?.place?.message}
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
            label="Location"
            hint="Box, jar or shelf."
            autoComplete="off"
            error={errors.storage?.location?.message}
            {...register('storage.location')}
          />
          <TextField
            label="Temperature (°C)"
            hint="Optional."
            type="number"
            inputMode="decimal"
            step="any"
            className="num"
            error={errors.storage?.temperatureC?.message}
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
            error={errors.storage?.humidityPct?.message}
            {...register('storage.humidityPct', { setValueAs: numberOrNull })}
          />
        </div>
      </Fieldset>

      <Fieldset legend="Packet photo and notes">
        <PhotoPicker
          label="Packet photo"
          hint="Optional. On a phone this opens the camera. It is uploaded once the lot is saved."
          file={photo}
          onChange={setPhoto}
          disabled={busy}
        />
        <div className="flex flex-col gap-1">
          <label htmlFor="lot-notes" className="font-semibold text-loam-900">
            Notes
          </label>
          <textarea
            id="lot-notes"
            rows={3}
            className="w-full rounded-lg border border-loam-300 bg-white px-3 py-2 text-base text-loam-900"
            {...register('notes')}
          />
          {errors.notes?.message ? <p className="text-sm font-semibold text-clay-700">{errors.notes.message}</p> : null}
        </div>
        <details className="rounded-lg border border-loam-200 p-3">
          <summary className="cursor-pointer font-semibold text-loam-900">Your own lot code (optional)</summary>
          <div className="mt-3">
            <TextField
              label="Lot code"
              hint="Left empty, Hilum makes one from the species and the year."
              autoComplete="off"
              autoCapitalize="characters"
              spellCheck={false}
              error={errors.code?.message}
              {...register('code', { setValueAs: (v: unknown) => (v === '' ? undefined : v) })}
            />
          </div>
        </details>
      </Fieldset>

      <div className="grid gap-3">
        {phase === 'uploading' ? <ProgressBar value={photoProgress} label="Uploading the packet photo" /> : null}
        <div>
          <Button type="submit" size="lg" isLoading={busy} className="w-full sm:w-auto">
            {phase === 'saving' ? 'Saving the lot…' : phase === 'uploading' ? 'Uploading the photo…' : 'Save lot'}
          </Button>
        </div>
      </div>
    </form>
  );
}

function GramsEstimate({ grams, perGram, speciesName }: { grams: number | undefined; perGram: number | null; speciesName: string | undefined }) {
  if (!speciesName) return <p className="text-sm text-loam-700">Choose the species to turn grams into seeds.</p>;
  if (perGram === null) {
    return (
      <FormAlert tone="info">
        There is no seeds-per-gram figure for {speciesName.toLowerCase()}, so a weight cannot be turned into a count.
        Count the seeds instead, or set this bank’s seeds per gram for the species on a lot page.
      </FormAlert>
    );
  }
  const valid = grams !== undefined && Number.isFinite(grams) && grams > 0;
  return (
    <p aria-live="polite" className="num rounded-lg bg-husk-100 px-3 py-2 font-semibold text-loam-900">
      {valid
        ? `≈ ${formatCount(Math.round(grams * perGram))} seeds at about ${formatCount(perGram)} seeds per gram`
        : `About ${formatCount(perGram)} seeds per gram`}
    </p>
  );
}
