import { useId, type InputHTMLAttributes, type ReactNode, type Ref } from 'react';
import { cn } from '../../lib/cn';

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
  ...inputProps
}: TextFieldProps) {
  const generatedId = useId();
  const inputId = id ?? generatedId;
  const hintId = hint ? `${inputId}-hint` : undefined;
  const errorId = error ? `${inputId}-error` : undefined;
  const describedBy =
    [inputProps['aria-describedby'], hintId, errorId].filter(Boolean).join(' ') || undefined;

  return (
    <div className={cn('flex flex-col gap-1', containerClassName)}>
      <label htmlFor={inputId} className={cn('font-semibold text-loam-900', hideLabel && 'sr-only')}>
        {label}
        {required ? <span className="ml-1 font-normal text-loam-600">(required)</span> : null}
      </label>
      {hint ? (
        <p id={hintId} className="text-sm text-loam-600">
          {hint}
        </p>
      ) : null}
      <input
        ref={ref}
        id={inputId}
        required={required}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy}
        className={cn(
          'min-h-11 w-full rounded-lg border bg-white px-3 py-2 text-base text-loam-900',
          'placeholder:text-loam-500 disabled:bg-loam-100 disabled:text-loam-600',
          error ? 'border-clay-700 border-2' : 'border-loam-300',
          className,
        )}
        {...inputProps}
      />
      {error ? (
        <p id={errorId} className="flex items-start gap-1.5 text-sm font-semibold text-clay-700">
          <svg viewBox="0 0 20 20" aria-hidden="true" className="mt-0.5 size-4 shrink-0" fill="currentColor">
            <path d="M10 2a8 8 0 1 0 0 16 8 8 0 0 0 0-16Zm-.9 4h1.8v5.5H9.1V6Zm0 7h1.8v1.8H9.1V13Z" />
          </svg>
          <span>{error}</span>
        </p>
      ) : null}
    </div>
  );
}
