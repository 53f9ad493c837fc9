import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { createPlantBodySchema, type ParentPlantDto } from '#shared/schemas/lots';
import type { SpeciesDto } from '#shared/schemas/species';
import { Button } from '#src/components/ui/button';
import { FormAlert } from '#src/components/ui/form-alert';
import { PhotoPicker } from '#src/components/ui/photo-picker';
import { ProgressBar } from '#src/components/ui/progress-bar';
import { SpeciesPicker } from '#src/components/ui/species-picker';
import { TextAreaField } from '#src/components/ui/text-area-field';
import { TextField } from '#src/components/ui/text-field';
import { applyServerError } from '#src/lib/form-errors';
import { useCreatePlant } from '../api/create-plant';
import { HybridCaution } from './plant-cautions';
import { EMPTY_ISOLATION, IsolationFields, isolationFromDraft, type IsolationDraft } from './isolation';

const resolver = zodResolver(createPlantBodySchema, {
  error: (issue) =>
    (issue as { expected?: unknown }).expected === 'number' ? 'Enter a year, e.g. 2025.' : undefined,
});
const numberOrNull = (value: unknown) =>
  value === '' || value === null || value === undefined ? null : Number(value);

export interface PlantFormProps {
  bankId: string;
  species: SpeciesDto[];
  /** The species to start with (the one a lot form had chosen). */
  initialSpeciesId?: string | undefined;
  /** The current season, to start the season box with. */
  season: number;
  /** After the plant is saved: upload the photo (reporting progress) and move on. */
  onCreated: (
    plant: ParentPlantDto,
    photo: File | null,
    onPhotoProgress: (fraction: number) => void,
  ) => Promise<void>;
  onCancel?: () => void;
}

/** A parent plant or row that seed is saved from. */
export function PlantForm({
  bankId,
  species,
  initialSpeciesId,
  season,
  onCreated,
  onCancel,
}: PlantFormProps) {
  const create = useCreatePlant(bankId);
  const [formError, setFormError] = useState<string>();
  const [photo, setPhoto] = useState<File | null>(null);
  const [phase, setPhase] = useState<'saving' | 'uploading' | null>(null);
  const [progress, setProgress] = useState(0);
  const [isolation, setIsolation] = useState<IsolationDraft>(EMPTY_ISOLATION);
  const [isolationError, setIsolationError] = useState<string>();
  const {
    register,
    control,
    handleSubmit,
    setError,
    reset,
    formState: { errors },
  } = useForm({
    resolver,
    defaultValues: {
      speciesId: initialSpeciesId ?? '',
      label: '',
      variety: '',
      location: '',
      season,
      hybrid: false,
      notes: '',
    },
  });
  const hybrid = useWatch({ control, name: 'hybrid' });

  const onSubmit = handleSubmit(async (fields) => {
    setFormError(undefined);
    const kept = isolationFromDraft(isolation);
    setIsolationError('error' in kept ? kept.error : undefined);
    if ('error' in kept) return;
    const body = { ...fields, isolation: kept.isolation };
    setPhase('saving');
    try {
      const plant = await create.mutateAsync(body);
      if (photo) {
        setPhase('uploading');
        setProgress(0);
      }
      await onCreated(plant, photo, setProgress);
      reset({
        speciesId: body.speciesId,
        label: '',
        variety: body.variety ?? '',
        location: body.location ?? '',
        season: body.season ?? season,
        hybrid: false,
        notes: '',
      });
      setPhoto(null);
      setIsolation(EMPTY_ISOLATION);
    } catch (error) {
      setFormError(
        applyServerError(error, setError, [
          'speciesId',
          'label',
          'variety',
          'location',
          'season',
          'hybrid',
          'notes',
        ]),
      );
    } finally {
      setPhase(null);
    }
  });

  return (
    <form noValidate onSubmit={onSubmit} className="grid gap-4" aria-label="New parent plant">
      <FormAlert>{formError}</FormAlert>
      <SpeciesPicker
        control={control}
        name="speciesId"
        species={species}
        hint={null}
        placeholder="Type to search"
      />
      <TextField
        label="Label"
        hint="How you tell it apart in the garden."
        placeholder="e.g. Row 3, tallest"
        required
        autoComplete="off"
        error={errors.label?.message}
        {...register('label')}
      />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField
          label="Variety"
          autoComplete="off"
          error={errors.variety?.message}
          {...register('variety')}
        />
        <TextField
          label="Garden location"
          autoComplete="off"
          error={errors.location?.message}
          {...register('location')}
        />
        <TextField
          label="Season"
          type="number"
          inputMode="numeric"
          min={1900}
          max={2100}
          className="num"
          error={errors.season?.message}
          {...register('season', { setValueAs: numberOrNull })}
        />
      </div>
      <label className="flex min-h-11 cursor-pointer items-center gap-3 rounded-lg border border-loam-200 bg-white p-3 has-checked:border-seedcoat-500 has-checked:bg-seedcoat-50">
        <input type="checkbox" className="size-5 shrink-0 accent-moss-700" {...register('hybrid')} />
        <span className="font-semibold text-loam-900">An F1 hybrid</span>
      </label>
      {hybrid ? <HybridCaution /> : null}
      <IsolationFields value={isolation} onChange={setIsolation} error={isolationError} />
      <TextAreaField label="Notes" error={errors.notes?.message} {...register('notes')} />
      <PhotoPicker
        label="Photo"
        hint="Optional. Uploaded once the plant is saved."
        file={photo}
        onChange={setPhoto}
        disabled={phase !== null}
      />
      {phase === 'uploading' ? <ProgressBar value={progress} label="Uploading the photo" /> : null}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" isLoading={phase !== null}>
          {phase === 'uploading' ? 'Uploading the photo…' : 'Save parent plant'}
        </Button>
        {onCancel ? (
          <Button variant="secondary" onClick={onCancel} disabled={phase !== null}>
            Cancel
          </Button>
        ) : null}
      </div>
    </form>
  );
}
