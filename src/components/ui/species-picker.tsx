import { useMemo, type ReactNode } from 'react';
import { Controller, useWatch, type Control, type FieldPathByValue, type FieldValues } from 'react-hook-form';
import type { SpeciesDto } from '#shared/schemas/species';
import { Combobox } from './combobox';

export interface SpeciesPickerProps<T extends FieldValues> {
  control: Control<T>;
  /** The form's species id field ('' until one is chosen). */
  name: FieldPathByValue<T, string>;
  species: readonly SpeciesDto[];
  /** null for none. */
  hint?: ReactNode;
  placeholder?: string;
  /** After the field takes a new species ('' while the grower types): clear what belonged to the old one. */
  onChosen?: (speciesId: string) => void;
  /** Opens a way to add a species the list lacks, offered under the box. */
  onAddSpecies?: (() => void) | undefined;
  /** Notes under the chosen species (its cautions and bench traits). */
  renderSpeciesNote?: ((species: SpeciesDto) => ReactNode) | undefined;
}

/**
 * "Species", required, searched by common or scientific name, as a react-hook-form field. A value
 * the form refuses reads "Choose a species from the list."; a message from the server is shown as sent.
 */
export function SpeciesPicker<T extends FieldValues>({
  control,
  name,
  species,
  hint = 'Type part of the common or scientific name.',
  placeholder = 'e.g. tomato or Solanum',
  onChosen,
  onAddSpecies,
  renderSpeciesNote,
}: SpeciesPickerProps<T>) {
  const options = useMemo(
    () => species.map((s) => ({ value: s.id, label: s.commonName, description: s.scientificName })),
    [species],
  );
  const value = useWatch({ control, name });
  const chosen = species.find((s) => s.id === value);
  return (
    <>
      <Controller
        control={control}
        name={name}
        render={({ field, fieldState: { error } }) => (
          <Combobox
            label="Species"
            hint={hint}
            placeholder={placeholder}
            required
            options={options}
            value={typeof field.value === 'string' ? field.value : ''}
            ref={field.ref}
            name={field.name}
            onBlur={field.onBlur}
            onChange={(next) => {
              field.onChange(next);
              onChosen?.(next);
            }}
            error={
              error
                ? error.type === 'server' && error.message
                  ? error.message
                  : 'Choose a species from the list.'
                : undefined
            }
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
    </>
  );
}
