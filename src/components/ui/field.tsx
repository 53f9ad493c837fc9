import type { ReactNode } from 'react';
import { cn } from '#src/lib/cn';

export interface FieldProps {
  /** The control's id: the label points at it, and the hint and error ids are made from it. */
  id: string;
  label: ReactNode;
  /** Help shown under the label before anything goes wrong ("Month and day, e.g. 05-12"). */
  hint?: ReactNode;
  /** The message for this field (from react-hook-form's `formState.errors` or an ApiError's `fields`). */
  error?: string | undefined;
  /** Visually hide the label (it stays for screen readers); use only where the context names the field. */
  hideLabel?: boolean;
  /** Says "(required)" after the label. */
  required?: boolean | undefined;
  className?: string | undefined;
  /** The control, and anything that belongs under it before the error (a list of matches). */
  children: ReactNode;
}

/**
 * What the control needs to be read with its hint and error: spread on the input, select or
 * textarea of a `Field` with the same id. `describedBy` keeps ids the caller adds of its own.
 */
export function fieldAria(
  id: string,
  {
    hint,
    error,
    describedBy,
  }: { hint?: ReactNode; error?: string | undefined; describedBy?: string | undefined },
) {
  return {
    'aria-invalid': error ? true : undefined,
    'aria-describedby':
      [describedBy, hint ? `${id}-hint` : undefined, error ? `${id}-error` : undefined]
        .filter(Boolean)
        .join(' ') || undefined,
  } as const;
}

/** Border of a control, red and thicker while its field has an error. */
export const controlClass = (error: string | undefined) =>
  cn(
    'min-h-11 w-full rounded-lg border bg-white px-3 py-2 text-base text-loam-900',
    error ? 'border-2 border-clay-700' : 'border-loam-300',
  );

/** One labelled field: the label, its hint, the control, and its error with a mark beside it. */
export function Field({
  id,
  label,
  hint,
  error,
  hideLabel = false,
  required,
  className,
  children,
}: FieldProps) {
  return (
    <div className={cn('flex flex-col gap-1', className)}>
      <label htmlFor={id} className={cn('font-semibold text-loam-900', hideLabel && 'sr-only')}>
        {label}
        {required ? <span className="ml-1 font-normal text-loam-600">(required)</span> : null}
      </label>
      {hint ? (
        <p id={`${id}-hint`} className="text-sm text-loam-600">
          {hint}
        </p>
      ) : null}
      {children}
      {error ? <FieldError id={`${id}-error`}>{error}</FieldError> : null}
    </div>
  );
}

/** A field's message, with a mark beside it; also for a group of controls (trays, parent plants). */
export function FieldError({ id, children }: { id?: string | undefined; children: ReactNode }) {
  return (
    <p id={id} className="flex items-start gap-1.5 text-sm font-semibold text-clay-700">
      <svg viewBox="0 0 20 20" aria-hidden="true" className="mt-0.5 size-4 shrink-0" fill="currentColor">
        <path d="M10 2a8 8 0 1 0 0 16 8 8 0 0 0 0-16Zm-.9 4h1.8v5.5H9.1V6Zm0 7h1.8v1.8H9.1V13Z" />
      </svg>
      <span>{children}</span>
    </p>
  );
}
