import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { HARDINESS_WORDS } from '#shared/plan-dates';
import {
  HARDINESS,
  overrideTraitsBodySchema,
  POLLINATION,
  type SpeciesDto,
  type TraitName,
} from '#shared/schemas/species';
import { Button } from '#src/components/ui/button';
import { Card } from '#src/components/ui/card';
import { FormAlert } from '#src/components/ui/form-alert';
import { SelectField } from '#src/components/ui/select-field';
import { TextField } from '#src/components/ui/text-field';
import { pollinationWords } from '#src/lib/pollination-words';
import { applyServerError } from '#src/lib/form-errors';
import { useClearSpeciesOverrides } from '../api/clear-species-overrides';
import { useUpdateSpeciesTraits } from '../api/update-species-traits';
import { SpeciesCautions } from './species-cautions';
import { BankValueBadge, TraitList } from './trait-list';

/**
 * The traits a bank most often knows better than the reference: its own seed and its own trays, when
 * its plants may go out and how soon they come up (the planner's dates), and how the species is kept
 * true (the seed-saving warnings). For a species the bank added itself, this is where they are set.
 */
const EDITABLE = [
  'seedsPerGram',
  'firstCountDay',
  'finalCountDay',
  'hardiness',
  'emergeDaysMin',
  'emergeDaysMax',
  'pollination',
  'isolationMeters',
  'minPlantsForSeed',
] as const satisfies readonly TraitName[];
type Editable = (typeof EDITABLE)[number];

const toNumberOrNull = (value: unknown) =>
  value === '' || value === null || value === undefined ? null : Number(value);
const toChoiceOrNull = (value: unknown) => (value === '' || value === undefined ? null : value);

const resolver = zodResolver(overrideTraitsBodySchema, {
  error: (issue) =>
    (issue as { expected?: unknown }).expected === 'number' || issue.code === 'invalid_type'
      ? 'Enter a number, or leave it empty.'
      : undefined,
});

function formValues(species: SpeciesDto) {
  return {
    traits: Object.fromEntries(EDITABLE.map((name) => [name, species.traits[name] ?? null])) as Pick<
      SpeciesDto['traits'],
      Editable
    >,
  };
}

function OwnValuesForm({
  bankId,
  species,
  onDone,
}: {
  bankId: string;
  species: SpeciesDto;
  onDone: () => void;
}) {
  const update = useUpdateSpeciesTraits(bankId, species.id);
  const [formError, setFormError] = useState<string>();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, dirtyFields },
  } = useForm({ resolver, defaultValues: formValues(species) });

  const onSubmit = handleSubmit(async ({ traits }) => {
    setFormError(undefined);
    // Only what was changed becomes the bank's own value; the rest keeps following the reference.
    const changed = Object.fromEntries(
      EDITABLE.filter((name) => dirtyFields.traits?.[name]).map((name) => [name, traits[name] ?? null]),
    ) as Partial<Pick<SpeciesDto['traits'], Editable>>;
    if (Object.keys(changed).length === 0) return onDone();
    try {
      await update.mutateAsync(changed);
      onDone();
    } catch (error) {
      setFormError(
        applyServerError(
          error,
          setError,
          EDITABLE.map((name) => `traits.${name}` as const),
        ),
      );
    }
  });

  return (
    <form noValidate onSubmit={onSubmit} className="mt-4 grid gap-4 border-t border-loam-100 pt-4">
      <FormAlert>{formError}</FormAlert>
      <p className="text-sm text-loam-700">
        Values you set here are used for this bank only, in place of the reference values, for every lot of{' '}
        {species.commonName.toLowerCase()}.
      </p>
      <div className="grid gap-4 sm:grid-cols-3">
        <TextField
          label="Seeds per gram"
          type="number"
          inputMode="decimal"
          min={0}
          step="any"
          className="num"
          error={errors.traits?.seedsPerGram?.message}
          {...register('traits.seedsPerGram', { setValueAs: toNumberOrNull })}
        />
        <TextField
          label="First count day"
          type="number"
          inputMode="numeric"
          min={1}
          max={120}
          className="num"
          error={errors.traits?.firstCountDay?.message}
          {...register('traits.firstCountDay', { setValueAs: toNumberOrNull })}
        />
        <TextField
          label="Final count day"
          type="number"
          inputMode="numeric"
          min={1}
          max={120}
          className="num"
          error={errors.traits?.finalCountDay?.message}
          {...register('traits.finalCountDay', { setValueAs: toNumberOrNull })}
        />
      </div>
      <fieldset className="grid gap-4 sm:grid-cols-3">
        <legend className="mb-2 font-semibold text-loam-900">Planting out and coming up</legend>
        <SelectField
          label="Hardiness"
          error={errors.traits?.hardiness?.message}
          {...register('traits.hardiness', { setValueAs: toChoiceOrNull })}
        >
          <option value="">Not known (planned as tender)</option>
          {HARDINESS.map((h) => (
            <option key={h} value={h}>
              {HARDINESS_WORDS[h][0]!.toUpperCase() + HARDINESS_WORDS[h].slice(1)}
            </option>
          ))}
        </SelectField>
        <TextField
          label="Fewest days to come up"
          type="number"
          inputMode="numeric"
          min={1}
          max={120}
          className="num"
          error={errors.traits?.emergeDaysMin?.message}
          {...register('traits.emergeDaysMin', { setValueAs: toNumberOrNull })}
        />
        <TextField
          label="Most days to come up"
          type="number"
          inputMode="numeric"
          min={1}
          max={120}
          className="num"
          error={errors.traits?.emergeDaysMax?.message}
          {...register('traits.emergeDaysMax', { setValueAs: toNumberOrNull })}
        />
      </fieldset>
      <fieldset className="grid gap-4 sm:grid-cols-3">
        <legend className="mb-2 font-semibold text-loam-900">Keeping the variety true</legend>
        <SelectField
          label="Pollination"
          error={errors.traits?.pollination?.message}
          {...register('traits.pollination', { setValueAs: toChoiceOrNull })}
        >
          <option value="">Not known</option>
          {POLLINATION.map((p) => (
            <option key={p} value={p}>
              {pollinationWords(p)}
            </option>
          ))}
        </SelectField>
        <TextField
          label="Metres between varieties"
          type="number"
          inputMode="decimal"
          min={0}
          step="any"
          className="num"
          error={errors.traits?.isolationMeters?.message}
          {...register('traits.isolationMeters', { setValueAs: toNumberOrNull })}
        />
        <TextField
          label="Plants to save seed from"
          type="number"
          inputMode="numeric"
          min={1}
          className="num"
          error={errors.traits?.minPlantsForSeed?.message}
          {...register('traits.minPlantsForSeed', { setValueAs: toNumberOrNull })}
        />
      </fieldset>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" isLoading={update.isPending}>
          Save this bank’s values
        </Button>
        <Button variant="secondary" onClick={onDone} disabled={update.isPending}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

export interface SpeciesTraitsCardProps {
  bankId: string;
  species: SpeciesDto;
  canEdit: boolean;
  headingLevel?: 2 | 3;
  /** Off where the page already shows the species' cautions higher up (the lot page). */
  showCautions?: boolean;
}

/** A species' traits with their sources; a grower sets the bank's own values for the editable ones. */
export function SpeciesTraitsCard({
  bankId,
  species,
  canEdit,
  headingLevel = 2,
  showCautions = true,
}: SpeciesTraitsCardProps) {
  const [editing, setEditing] = useState(false);
  const clear = useClearSpeciesOverrides(bankId, species.id);
  return (
    <Card
      headingLevel={headingLevel}
      title={
        <>
          {species.commonName}{' '}
          <span className="font-normal italic text-loam-700">{species.scientificName}</span>
        </>
      }
      description={species.family ?? undefined}
      actions={
        canEdit && !editing ? (
          <Button variant="secondary" onClick={() => setEditing(true)}>
            Set this bank’s values
          </Button>
        ) : undefined
      }
    >
      <div className="grid gap-4">
        {showCautions ? <SpeciesCautions species={species} /> : null}
        <TraitList species={species} />
        {species.overridden.length > 0 ? (
          <div className="flex flex-wrap items-center gap-2 text-sm text-loam-700">
            <span>
              Marked <BankValueBadge /> where this bank uses its own value.
            </span>
            {canEdit ? (
              <Button variant="quiet" isLoading={clear.isPending} onClick={() => clear.mutate()}>
                Use the reference values again
              </Button>
            ) : null}
          </div>
        ) : null}
        <FormAlert>{clear.error?.message}</FormAlert>
      </div>
      {editing ? <OwnValuesForm bankId={bankId} species={species} onDone={() => setEditing(false)} /> : null}
    </Card>
  );
}
