import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { createSpaceBodySchema, type GrowingSpaceDto } from '#shared/schemas/spaces';
import { CELLS_PER_TRAY } from '#shared/species-space';
import { Button } from '#src/components/ui/button';
import { FormAlert } from '#src/components/ui/form-alert';
import { SelectField } from '#src/components/ui/select-field';
import { TextField } from '#src/components/ui/text-field';
import { applyServerError } from '#src/lib/form-errors';
import { useSaveSpace } from '../api/save-space';

const resolver = zodResolver(createSpaceBodySchema, {
  error: (issue) =>
    (issue as { expected?: unknown }).expected === 'number' ? 'How many fit? A whole number.' : undefined,
});

export interface SpaceFormProps {
  bankId: string;
  /** The space to change; without one the form adds a new space. */
  space?: GrowingSpaceDto;
  onDone?: () => void;
  onCancel?: () => void;
}

/** A shelf or box under lights: its name and how many trays or cells fit. */
export function SpaceForm({ bankId, space, onDone, onCancel }: SpaceFormProps) {
  const save = useSaveSpace(bankId, space?.id);
  const [formError, setFormError] = useState<string>();
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting },
  } = useForm({
    resolver,
    defaultValues: { name: space?.name ?? '', capacity: space?.capacity ?? 1, unit: space?.unit ?? 'trays' },
  });

  const onSubmit = handleSubmit(async (body) => {
    setFormError(undefined);
    try {
      await save.mutateAsync(body);
      if (!space) reset({ name: '', capacity: body.capacity, unit: body.unit });
      onDone?.();
    } catch (error) {
      setFormError(applyServerError(error, setError, ['name', 'capacity', 'unit']));
    }
  });

  return (
    <form
      noValidate
      onSubmit={onSubmit}
      className="grid gap-3"
      aria-label={space ? `Change ${space.name}` : 'New growing space'}
    >
      <FormAlert>{formError}</FormAlert>
      <TextField
        label="Name"
        placeholder="e.g. Shelf under the stairs"
        required
        autoComplete="off"
        error={errors.name?.message}
        {...register('name')}
      />
      <div className="grid grid-cols-2 gap-3">
        <TextField
          label="How many fit"
          type="number"
          inputMode="numeric"
          min={1}
          step={1}
          required
          error={errors.capacity?.message}
          {...register('capacity', { valueAsNumber: true })}
        />
        <SelectField label="Counted in" error={errors.unit?.message} {...register('unit')}>
          <option value="trays">Trays ({CELLS_PER_TRAY} cells)</option>
          <option value="cells">Cells</option>
        </SelectField>
      </div>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" isLoading={isSubmitting}>
          {space ? 'Save' : 'Add space'}
        </Button>
        {onCancel ? (
          <Button variant="quiet" onClick={onCancel}>
            Cancel
          </Button>
        ) : null}
      </div>
    </form>
  );
}
