import type { ReactNode } from 'react';
import type { UseFormRegisterReturn } from 'react-hook-form';
import type { ParentPlantDto } from '#shared/schemas/lots';
import { SWAP_ACROSS_BORDERS, TREATED_SEED } from '#shared/cautions';
import { Caution } from '#src/components/ui/caution';
import { FieldError } from '#src/components/ui/field';
import { cn } from '#src/lib/cn';

/** Empty boxes leave a number out (undefined); anything else is read as a number. */
export const numberOrUndefined = (value: unknown) =>
  value === '' || value === null || value === undefined ? undefined : Number(value);
/** Empty boxes clear a nullable number. */
export const numberOrNull = (value: unknown) =>
  value === '' || value === null || value === undefined ? null : Number(value);
export const emptyToNull = (value: unknown) => (value === '' ? null : value);

/** zod's own messages for a mistyped number read like a program; these read like a person. */
export function friendlyNumberError(issue: { code?: string; expected?: unknown; input?: unknown }) {
  if (issue.expected === 'number' || (issue.code === 'invalid_type' && typeof issue.input === 'number')) {
    return 'Enter a number.';
  }
  return undefined;
}

export function SwapCaution({ foldOnPhone }: { foldOnPhone?: boolean }) {
  return (
    <Caution title={SWAP_ACROSS_BORDERS.title} foldOnPhone={foldOnPhone}>
      {SWAP_ACROSS_BORDERS.text}
    </Caution>
  );
}

/** Seed sold coated with a fungicide or another treatment: how to handle it safely. */
export function TreatedCaution({ foldOnPhone }: { foldOnPhone?: boolean }) {
  return (
    <Caution title={TREATED_SEED.title} foldOnPhone={foldOnPhone}>
      <p>{TREATED_SEED.text}</p>
    </Caution>
  );
}

export interface TreatedCheckboxProps {
  /** From react-hook-form's `register('treated')`. */
  field: UseFormRegisterReturn<'treated'>;
}

/** "Treated seed" as a large tick box. */
export function TreatedCheckbox({ field }: TreatedCheckboxProps) {
  return (
    <label
      className={cn(
        'flex min-h-11 cursor-pointer items-start gap-3 rounded-lg border border-loam-200 bg-white p-3 hover:bg-husk-50',
        'has-checked:border-seedcoat-500 has-checked:bg-seedcoat-50',
      )}
    >
      <input type="checkbox" className="mt-1 size-5 shrink-0 accent-moss-700" {...field} />
      <span className="min-w-0">
        <span className="block font-semibold text-loam-900">
          Treated seed (coated with fungicide or another treatment)
        </span>
        <span className="block text-sm text-loam-700">
          Treated seed is usually dyed a bright colour (pink, blue or green), and the packet says so.
        </span>
      </span>
    </label>
  );
}

export function Fieldset({
  legend,
  children,
  className,
}: {
  legend: ReactNode;
  children: ReactNode;
  className?: string;
}) {
  return (
    <fieldset
      className={cn('grid min-w-0 gap-4 rounded-xl border border-loam-200 bg-white p-4 sm:p-5', className)}
    >
      <legend className="px-1 text-lg font-bold text-loam-900">{legend}</legend>
      {children}
    </fieldset>
  );
}

export interface ChoiceCardProps {
  name: string;
  value: string;
  checked: boolean;
  onChange: () => void;
  label: ReactNode;
  hint?: ReactNode;
  type?: 'radio' | 'checkbox';
}

/** A radio or checkbox with its label as a large tap target. */
export function ChoiceCard({ name, value, checked, onChange, label, hint, type = 'radio' }: ChoiceCardProps) {
  return (
    <label
      className={cn(
        'flex min-h-11 cursor-pointer items-start gap-3 rounded-lg border border-loam-200 bg-white p-3 hover:bg-husk-50',
        'has-checked:border-moss-600 has-checked:bg-moss-50',
      )}
    >
      <input
        type={type}
        name={name}
        value={value}
        checked={checked}
        onChange={onChange}
        className="mt-1 size-5 shrink-0 accent-moss-700"
      />
      <span className="min-w-0">
        <span className="block font-semibold text-loam-900">{label}</span>
        {hint ? <span className="block text-sm text-loam-700">{hint}</span> : null}
      </span>
    </label>
  );
}

export interface ParentPlantPickerProps {
  plants: ParentPlantDto[];
  value: string[];
  onChange: (ids: string[]) => void;
  error?: string | undefined;
}

/** Ticks the parent plants a lot was saved from (the caller passes only that species' plants). */
export function ParentPlantPicker({ plants, value, onChange, error }: ParentPlantPickerProps) {
  return (
    <div role="group" aria-label="Parent plants" className="grid gap-2">
      {plants.map((plant) => {
        const checked = value.includes(plant.id);
        return (
          <ChoiceCard
            key={plant.id}
            type="checkbox"
            name="parentPlantIds"
            value={plant.id}
            checked={checked}
            onChange={() => onChange(checked ? value.filter((id) => id !== plant.id) : [...value, plant.id])}
            label={plant.label}
            hint={
              [plant.variety, plant.location, plant.season, plant.hybrid ? 'F1 hybrid' : null]
                .filter(Boolean)
                .join(' · ') || undefined
            }
          />
        );
      })}
      {error ? <FieldError>{error}</FieldError> : null}
    </div>
  );
}
