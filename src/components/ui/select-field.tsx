import { useId, type ReactNode, type Ref, type SelectHTMLAttributes } from 'react';
import { cn } from '../../lib/cn';

export interface SelectFieldProps extends SelectHTMLAttributes<HTMLSelectElement> {
  label: ReactNode;
  hint?: ReactNode;
  error?: string | undefined;
  hideLabel?: boolean;
  ref?: Ref<HTMLSelectElement>;
  containerClassName?: string;
}

/** A labelled native select (the phone's own picker), with a hint and an error like TextField. */
export function SelectField({
  label,
  hint,
  error,
  hideLabel = false,
  id,
  className,
  containerClassName,
  ref,
  children,
  ...selectProps
}: SelectFieldProps) {
  const generatedId = useId();
  const selectId = id ?? generatedId;
  const hintId = hint ? `${selectId}-hint` : undefined;
  const errorId = error ? `${selectId}-error` : undefined;
  const describedBy = [selectProps['aria-describedby'], hintId, errorId].filter(Boolean).join(' ') || undefined;
  return (
    <div className={cn('flex flex-col gap-1', containerClassName)}>
      <label htmlFor={selectId} className={cn('font-semibold text-loam-900', hideLabel && 'sr-only')}>
        {label}
      </label>
      {hint ? (
        <p id={hintId} className="text-sm text-loam-600">
          {hint}
        </p>
      ) : null}
      <select
        ref={ref}
        id={selectId}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy}
        className={cn(
          'min-h-11 w-full rounded-lg border bg-white px-3 py-2 text-base text-loam-900',
          'disabled:bg-loam-100 disabled:text-loam-700',
          error ? 'border-2 border-clay-700' : 'border-loam-300',
          className,
        )}
        {...selectProps}
      >
        {children}
      </select>
      {error ? (
        <p id={errorId} className="text-sm font-semibold text-clay-700">
          {error}
        </p>
      ) : null}
    </div>
  );
}
