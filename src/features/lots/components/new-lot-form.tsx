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
/** How the grower knows the amount: counted, about N, weighed, or not known (never read as zero). */
type AmountChoice = 'counted' | 'estimated' | 'weighed' | 'unknown';
type NewLotFields = z.input<typeof createLotBodySchema>;

export interface NewLotFormProps {
  bankId: string;
  species: SpeciesDto[];
  plants: ParentPlantDto[];
  /** Today in the bank's time zone: the latest harvest date (the date itself starts empty). */
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
  /** Generations: seed saved from plants grown from a lot starts with their species, variety and ticks. */
  initial?: { speciesId: string; variety: string; parentPlantIds: string[] } | undefined;
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
  initial,
}: NewLotFormProps) {
  const create = useCreateLot(bankId);
  const [formError, setFormError] = useState<string>();
  const [dateKind, setDateKind] = useState<DateKind>('harvest');
  const [amountChoice, setAmountChoice] = useState<AmountChoice>('counted');
  const [photo, setPhoto] = useState<File | null>(null);
  const [phase, setPhase] = useState<'saving' | 'uploading' | null>(null);
  const [photoProgress, setPhotoProgress] = useState(0);

  const form = useForm({
    resolver,
    defaultValues: {
      speciesId: initial?.speciesId ?? '',
      variety: initial?.variety ?? '',
      origin: 'saved' as Origin,
      sourceName: '',
      // Empty until chosen: a harvest date is a fact the grower gives, never today by default.
      harvestDate: null,
      packedForSeason: null,
      seedCount: undefined,
      grams: undefined,
      parentPlantIds: initial?.parentPlantIds ?? [],
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

  const onSubmit = handleSubmit(async (fields) => {
    setFormError(undefined);
    const body = withAmount(fields, amountChoice);
    if ('missing' in body) {
      setError(body.missing, { type: 'required', message: body.message }, { shouldFocus: true });
      return;
    }
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
    setValue('harvestDate', null);
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

        <QuantityFieldset
          choice={amountChoice}
          onChoice={setAmountChoice}
          perGram={perGram}
          speciesName={chosen?.commonName}
        />

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

type CreateLotFields = z.output<typeof createLotBodySchema>;

/**
 * The body to send for the amount chosen: a count or a weight as the API's short forms, "about N"
 * and "not known" as `amount`; or the field to fill first, with what to say there.
 */
export function withAmount(
  fields: CreateLotFields,
  choice: AmountChoice,
): CreateLotFields | { missing: 'seedCount' | 'grams'; message: string } {
  const { seedCount, grams, ...rest } = fields;
  switch (choice) {
    case 'counted':
      return seedCount === undefined
        ? { missing: 'seedCount', message: 'Give the number of seeds, or choose “Not known”.' }
        : { ...rest, seedCount };
    case 'estimated':
      return seedCount === undefined || seedCount < 1
        ? { missing: 'seedCount', message: 'About how many seeds? Or choose “Not known”.' }
        : { ...rest, amount: { kind: 'estimated', seeds: seedCount } };
    case 'weighed':
      return grams === undefined
        ? { missing: 'grams', message: 'Give the weight in grams, or choose “Not known”.' }
        : { ...rest, grams };
    case 'unknown':
      return { ...rest, amount: { kind: 'unknown' } };
  }
}

const AMOUNT_CHOICES: readonly { value: AmountChoice; label: string; hint: string }[] = [
  { value: 'counted', label: 'Seed count', hint: 'You counted them' },
  { value: 'estimated', label: 'About how many', hint: 'A rough number' },
  { value: 'weighed', label: 'Weight in grams', hint: 'Turned into seeds' },
  { value: 'unknown', label: 'Not known', hint: 'Not zero: set it later' },
];

/** The amount: counted, about N, a weight turned into seeds, or not known (never read as zero). */
function QuantityFieldset({
  choice,
  onChoice,
  perGram,
  speciesName,
}: {
  choice: AmountChoice;
  onChoice: (choice: AmountChoice) => void;
  perGram: number | null;
  speciesName: string | undefined;
}) {
  const {
    register,
    setValue,
    clearErrors,
    control,
    formState: { errors },
  } = useFormContext<NewLotFields>();
  const grams = useWatch({ control, name: 'grams' });
  const choose = (next: AmountChoice) => {
    onChoice(next);
    clearErrors(['seedCount', 'grams']);
    if (next !== 'weighed') setValue('grams', undefined);
    if (next === 'weighed' || next === 'unknown') setValue('seedCount', undefined);
  };
  return (
    <Fieldset legend="How much">
      <div role="radiogroup" aria-label="Quantity as" className="grid grid-cols-2 gap-2 sm:grid-cols-4">
        {AMOUNT_CHOICES.map((c) => (
          <ChoiceCard
            key={c.value}
            name="quantityKind"
            value={c.value}
            checked={choice === c.value}
            onChange={() => choose(c.value)}
            label={c.label}
            hint={c.hint}
          />
        ))}
      </div>
      {choice === 'counted' || choice === 'estimated' ? (
        <TextField
          key={choice}
          label={choice === 'counted' ? 'Number of seeds' : 'About how many seeds'}
          hint={
            choice === 'estimated' ? 'Shown as “about” this many; seeds taken out come off it.' : undefined
          }
          type="number"
          inputMode="numeric"
          min={0}
          step={1}
          className="num"
          error={errors.seedCount?.message}
          {...register('seedCount', { setValueAs: numberOrUndefined })}
        />
      ) : choice === 'weighed' ? (
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
      ) : (
        <p className="rounded-lg bg-husk-100 px-3 py-2 text-loam-900">
          Saved as “amount not known” — not as zero. It is never shown as low stock, and seeds taken out are
          still recorded. Count, estimate or weigh it on the lot’s page whenever you like.
        </p>
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
        count. Choose “Not known” or “About how many” for now, then weigh a sample on the lot’s page and set
        the amount by weight there.
      </FormAlert>
    );
  }
  const valid = grams !== undefined && Number.isFinite(grams) && grams > 0;
  return (
    <div className="rounded-lg bg-husk-100 px-3 py-2 text-loam-900">
      <p aria-live="polite" className="num font-semibold">
        {valid
          ? `≈ ${formatCount(Math.round(grams * perGram))} seeds at about ${formatCount(perGram)} seeds per gram`
          : `About ${formatCount(perGram)} seeds per gram`}
      </p>
      <p className="text-sm text-loam-700">
        The species’ typical figure. Chaffy home-cleaned seed holds fewer: weigh a sample on the lot’s page
        and Hilum uses this lot’s own.
      </p>
    </div>
  );
}
