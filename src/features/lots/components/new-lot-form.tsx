import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useMemo, useState, type ReactNode } from 'react';
import { FormProvider, useForm, useFormContext, useWatch } from 'react-hook-form';
import type { z } from 'zod';
import { Link } from 'react-router-dom';
import { createLotBodySchema, type LotDto, type ParentPlantDto } from '#shared/schemas/lots';
import type { SpeciesDto } from '#shared/schemas/species';
import { Button } from '#src/components/ui/button';
import { FormAlert } from '#src/components/ui/form-alert';
import { PhotoPicker } from '#src/components/ui/photo-picker';
import { ProgressBar } from '#src/components/ui/progress-bar';
import { SpeciesPicker } from '#src/components/ui/species-picker';
import { TextField } from '#src/components/ui/text-field';
import { paths } from '#src/config/paths';
import { isApiError } from '#src/lib/api-client';
import { applyServerError } from '#src/lib/form-errors';
import { useCreateLot } from '../api/create-lot';
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
import { formatCount, originHints, originLabels, type Origin } from './lot-format';
import { ChoiceCard, Fieldset, friendlyNumberError, numberOrUndefined } from './lot-form-parts';

const resolver = zodResolver(createLotBodySchema, { error: friendlyNumberError });

const ORIGINS: readonly Origin[] = ['saved', 'swapped', 'bought'];

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

type DateKind = 'harvest' | 'season';
type NewLotFields = z.input<typeof createLotBodySchema>;

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
  const [dateKind, setDateKind] = useState<DateKind>('harvest');
  const [photo, setPhoto] = useState<File | null>(null);
  const [phase, setPhase] = useState<'saving' | 'uploading' | null>(null);
  const [photoProgress, setPhotoProgress] = useState(0);

  const form = useForm({
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

  const {
    register,
    control,
    handleSubmit,
    setError,
    setValue,
    getValues,
    formState: { errors, isSubmitting },
  } = form;
  const speciesId = useWatch({ control, name: 'speciesId' });
  const origin = useWatch({ control, name: 'origin' });
  const chosen = species.find((s) => s.id === speciesId);
  const perGram = chosen?.traits.seedsPerGram ?? null;
  const speciesPlants = useMemo(() => plants.filter((p) => p.speciesId === speciesId), [plants, speciesId]);

  // A species added from this form is chosen as soon as it shows up in the list.
  useEffect(() => {
    if (addedSpeciesId && species.some((s) => s.id === addedSpeciesId))
      setValue('speciesId', addedSpeciesId, { shouldValidate: true });
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

  // A lot is dated by its harvest or by the season on its packet, never both.
  const chooseDateKind = (kind: DateKind) => {
    setDateKind(kind);
    setValue('harvestDate', kind === 'harvest' ? today : null);
    setValue('packedForSeason', kind === 'season' ? Number(today.slice(0, 4)) : null);
  };

  return (
    <FormProvider {...form}>
      <form noValidate onSubmit={onSubmit} className="grid gap-5">
        <FormAlert>{formError}</FormAlert>

        <Fieldset legend="Seed">
          <SpeciesPicker
            control={control}
            name="speciesId"
            species={species}
            // Parent plants belong to one species: drop the ticks that no longer fit.
            onChosen={(next) =>
              setValue(
                'parentPlantIds',
                (getValues('parentPlantIds') ?? []).filter((id) =>
                  plants.some((p) => p.id === id && p.speciesId === next),
                ),
              )
            }
            onAddSpecies={onAddSpecies}
            renderSpeciesNote={renderSpeciesNote}
          />
          <VarietyField hint="As on the packet or your label; “unknown” is fine." required />
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
                  if (value === 'bought' && dateKind === 'harvest') chooseDateKind('season');
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
          <TreatedAndCautions />
        </Fieldset>

        <WhenFieldset today={today} dateKind={dateKind} onDateKind={chooseDateKind} />

        <QuantityFieldset perGram={perGram} speciesName={chosen?.commonName} />

        <Fieldset legend="Parent plants">
          {!speciesId ? (
            <p className="text-loam-700">Choose the species first to list its parent plants.</p>
          ) : speciesPlants.length === 0 ? (
            <p className="text-loam-700">
              No parent plants of {chosen?.commonName.toLowerCase() ?? 'this species'} yet.
            </p>
          ) : (
            <ParentPlantsField plants={speciesPlants} />
          )}
          <div className="flex flex-wrap gap-2">
            {onAddPlant ? (
              <Button variant="secondary" onClick={() => onAddPlant(speciesId || undefined)}>
                Add a parent plant
              </Button>
            ) : (
              <Link
                to={paths.plants.getHref(bankId)}
                className="min-h-11 font-semibold text-moss-800 underline"
              >
                Add a parent plant
              </Link>
            )}
          </div>
          <PlantsBulkedField
            hint="How many plants the seed was gathered from. Cross-pollinating crops keep their vigour with many."
            className="num sm:max-w-48"
          />
        </Fieldset>

        <Fieldset legend="Storage">
          <div className="grid gap-4 sm:grid-cols-2">
            <StorageFields locationLabel="Location" locationHint="Box, jar or shelf." />
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
          <LotNotesField id="lot-notes" />
          <details className="rounded-lg border border-loam-200 p-3">
            <summary className="cursor-pointer font-semibold text-loam-900">
              Your own lot code (optional)
            </summary>
            <div className="mt-3">
              <LotCodeField
                blankLeavesOut
                hint="Left empty, Hilum makes one from the species and the year."
                autoCapitalize="characters"
              />
            </div>
          </details>
        </Fieldset>

        <div className="grid gap-3">
          {phase === 'uploading' ? (
            <ProgressBar value={photoProgress} label="Uploading the packet photo" />
          ) : null}
          <div>
            <Button type="submit" size="lg" isLoading={busy} className="w-full sm:w-auto">
              {phase === 'saving'
                ? 'Saving the lot…'
                : phase === 'uploading'
                  ? 'Uploading the photo…'
                  : 'Save lot'}
            </Button>
          </div>
        </div>
      </form>
    </FormProvider>
  );
}

function WhenFieldset({
  today,
  dateKind,
  onDateKind,
}: {
  today: string;
  dateKind: DateKind;
  onDateKind: (kind: DateKind) => void;
}) {
  return (
    <Fieldset legend="When">
      <div role="radiogroup" aria-label="Dated by" className="grid gap-2 sm:grid-cols-2">
        <ChoiceCard
          name="dateKind"
          value="harvest"
          checked={dateKind === 'harvest'}
          onChange={() => onDateKind('harvest')}
          label="Harvest date"
          hint="When the seed was gathered"
        />
        <ChoiceCard
          name="dateKind"
          value="season"
          checked={dateKind === 'season'}
          onChange={() => onDateKind('season')}
          label="Packed for season"
          hint="The year printed on a bought packet"
        />
      </div>
      {dateKind === 'harvest' ? <HarvestDateField max={today} /> : <PackedForSeasonField showsHarvestError />}
    </Fieldset>
  );
}

/** A seed count, or a weight turned into one through the species' seeds per gram. */
function QuantityFieldset({
  perGram,
  speciesName,
}: {
  perGram: number | null;
  speciesName: string | undefined;
}) {
  const [quantityKind, setQuantityKind] = useState<'count' | 'grams'>('count');
  const {
    register,
    setValue,
    control,
    formState: { errors },
  } = useFormContext<NewLotFields>();
  const grams = useWatch({ control, name: 'grams' });
  return (
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
          <GramsEstimate grams={grams} perGram={perGram} speciesName={speciesName} />
        </>
      )}
    </Fieldset>
  );
}

function GramsEstimate({
  grams,
  perGram,
  speciesName,
}: {
  grams: number | undefined;
  perGram: number | null;
  speciesName: string | undefined;
}) {
  if (!speciesName)
    return <p className="text-sm text-loam-700">Choose the species to turn grams into seeds.</p>;
  if (perGram === null) {
    return (
      <FormAlert tone="info">
        There is no seeds-per-gram figure for {speciesName.toLowerCase()}, so a weight cannot be turned into a
        count. Count the seeds instead, or set this bank’s seeds per gram for the species on a lot page.
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
