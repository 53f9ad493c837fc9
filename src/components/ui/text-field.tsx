import { useId, type InputHTMLAttributes, type ReactNode, type Ref } from 'react';
import { cn } from '#src/lib/cn';
import { controlClass, Field, fieldAria } from './field';

export interface TextFieldProps extends Omit<InputHTMLAttributes<HTMLInputElement>, 'size'> {
  label: ReactNode;
  /** Help shown under the label before anything goes wrong ("Month and day, e.g. 05-12"). */
  hint?: ReactNode;
  /** The message for this field (from react-hook-form's `formState.errors` or an ApiError's `fields`). */
  error?: string | undefined;
  /** Visually hide the label (it stays for screen readers); use only where the context names the field. */
  hideLabel?: boolean;
  /** React 19 passes `ref` as a prop, so `{...register('name')}` works as is. */
  ref?: Ref<HTMLInputElement>;
  containerClassName?: string;
}

export function TextField({
  label,
  hint,
  error,
  hideLabel = false,
  id,
  className,
  containerClassName,
  required,
  ref,
  'aria-describedby': describedBy,
  ...inputProps
}: TextFieldProps) {
  const generatedId = useId();
  const inputId = id ?? generatedId;
  return (
    <Field
      id={inputId}
      label={label}
      hint={hint}
      error={error}
      hideLabel={hideLabel}
      required={required}
      className={containerClassName}
    >
      <input
        ref={ref}
        id={inputId}
        required={required}
        {...fieldAria(inputId, { hint, error, describedBy })}
        className={cn(
          controlClass(error),
          'placeholder:text-loam-500 disabled:bg-loam-100 disabled:text-loam-600',
          className,
        )}
        {...inputProps}
      />
    </Field>
  );
}
