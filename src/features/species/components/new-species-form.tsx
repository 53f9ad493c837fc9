import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { createSpeciesBodySchema, type SpeciesDto } from '#shared/schemas/species';
import { Button } from '#src/components/ui/button';
import { FormAlert } from '#src/components/ui/form-alert';
import { SelectField } from '#src/components/ui/select-field';
import { TextField } from '#src/components/ui/text-field';
import { applyServerError } from '#src/lib/form-errors';
import { useCreateSpecies } from '../api/create-species';

const numberOrNull = (value: string) => (value.trim() === '' ? null : Number(value));
/** Messages for number boxes, plainer than the schema's (which speaks of types). */
const numberHints = {
  startWeeksFrom: 'Whole weeks, 0 to 26.',
  startWeeksTo: 'Whole weeks, 0 to 26.',
  storageLifeYears: 'A number of years, e.g. 3.',
} as const;

/** What the form asks; the rest of a species' traits are set later on its card ("Set this bank's values"). */
interface Values {
  commonName: string;
  scientificName: string;
  family: string;
  startMethod: 'indoor' | 'direct' | 'either';
  startWeeksFrom: string;
  startWeeksTo: string;
  storageLifeYears: string;
  poisonous: boolean;
}

export interface NewSpeciesFormProps {
  bankId: string;
  onCreated: (species: SpeciesDto) => void;
  onCancel: () => void;
}

/** A species the reference set lacks, added to this bank: its names, how it is started, and a caution flag. */
export function NewSpeciesForm({ bankId, onCreated, onCancel }: NewSpeciesFormProps) {
  const create = useCreateSpecies(bankId);
  const [formError, setFormError] = useState<string>();
  const {
    register,
    handleSubmit,
    setError,
    control,
    formState: { errors, isSubmitting },
  } = useForm<Values>({
    defaultValues: {
      commonName: '',
      scientificName: '',
      family: '',
      startMethod: 'indoor',
      startWeeksFrom: '',
      startWeeksTo: '',
      storageLifeYears: '',
      poisonous: false,
    },
  });

  const startMethod = useWatch({ control, name: 'startMethod' });

  const onSubmit = handleSubmit(async (values) => {
    setFormError(undefined);
    const parsed = createSpeciesBodySchema.safeParse({
      commonName: values.commonName,
      scientificName: values.scientificName,
      family: values.family.trim() || null,
      traits: {
        startMethod: values.startMethod,
        startWeeksFrom: values.startMethod === 'direct' ? null : numberOrNull(values.startWeeksFrom),
        startWeeksTo: values.startMethod === 'direct' ? null : numberOrNull(values.startWeeksTo),
        storageLifeYears: numberOrNull(values.storageLifeYears),
        poisonous: values.poisonous,
      },
    });
    if (!parsed.success) {
      for (const issue of parsed.error.issues) {
        const field = (issue.path.at(-1) ?? 'commonName') as keyof Values;
        setError(field, {
          type: 'client',
          message:
            (issue.code !== 'custom' && numberHints[field as keyof typeof numberHints]) || issue.message,
        });
      }
      return;
    }
    try {
      onCreated(await create.mutateAsync(parsed.data));
    } catch (error) {
      setFormError(applyServerError(error, setError, ['commonName', 'scientificName', 'family']));
    }
  });

  return (
    <form noValidate onSubmit={onSubmit} className="grid gap-4" aria-label="New species">
      <FormAlert>{formError}</FormAlert>
      <p className="text-loam-700">
        For a plant Hilum does not list. Its count days, temperatures and seeds per gram can be set later on a
        lot’s page, under the species.
      </p>
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField
          label="Common name"
          required
          autoComplete="off"
          placeholder="e.g. love-in-a-mist"
          error={errors.commonName?.message}
          {...register('commonName')}
        />
        <TextField
          label="Scientific name"
          required
          autoComplete="off"
          placeholder="e.g. Nigella damascena"
          error={errors.scientificName?.message}
          {...register('scientificName')}
        />
        <TextField
          label="Family"
          autoComplete="off"
          placeholder="e.g. Ranunculaceae"
          error={errors.family?.message}
          {...register('family')}
        />
        <SelectField label="Usually started" {...register('startMethod')}>
          <option value="indoor">Indoors, before the last frost</option>
          <option value="direct">Sown direct outdoors</option>
          <option value="either">Either way</option>
        </SelectField>
        {startMethod !== 'direct' ? (
          <fieldset className="grid gap-2 sm:col-span-2">
            <legend className="font-semibold text-loam-900">Indoor sowing window</legend>
            <p className="text-sm text-loam-700">
              Weeks before the last spring frost, from the earliest to the latest sowing; the planner counts
              back from them.
            </p>
            <div className="grid grid-cols-2 gap-4">
              <TextField
                label="From (weeks before)"
                type="number"
                inputMode="numeric"
                min={0}
                max={26}
                error={errors.startWeeksFrom?.message}
                {...register('startWeeksFrom')}
              />
              <TextField
                label="Until (weeks before)"
                type="number"
                inputMode="numeric"
                min={0}
                max={26}
                error={errors.startWeeksTo?.message}
                {...register('startWeeksTo')}
              />
            </div>
          </fieldset>
        ) : null}
        <TextField
          label="Typical seed life (years)"
          hint="How long its seed keeps in ordinary storage, if you know. It guides the decline until the lots are tested twice."
          type="number"
          inputMode="decimal"
          min={0.5}
          step={0.5}
          error={errors.storageLifeYears?.message}
          {...register('storageLifeYears')}
        />
      </div>
      <label className="flex items-start gap-3 rounded-lg border border-loam-200 p-3">
        <input type="checkbox" className="mt-1 size-5 accent-moss-700" {...register('poisonous')} />
        <span>
          <span className="block font-semibold text-loam-900">Its seed or plant is poisonous</span>
          <span className="block text-sm text-loam-700">
            Hilum then shows the poisonous-seed caution on its lots. Your local poison centre or extension
            service can say which plants are.
          </span>
        </span>
      </label>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" isLoading={isSubmitting}>
          Add species
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
