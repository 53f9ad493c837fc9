import { useId, type ReactNode, type Ref, type SelectHTMLAttributes } from 'react';
import { cn } from '#src/lib/cn';
import { controlClass, Field, fieldAria } from './field';

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
  'aria-describedby': describedBy,
  ...selectProps
}: SelectFieldProps) {
  const generatedId = useId();
  const selectId = id ?? generatedId;
  return (
    <Field
      id={selectId}
      label={label}
      hint={hint}
      error={error}
      hideLabel={hideLabel}
      className={containerClassName}
    >
      <select
        ref={ref}
        id={selectId}
        {...fieldAria(selectId, { hint, error, describedBy })}
        className={cn(controlClass(error), 'disabled:bg-loam-100 disabled:text-loam-700', className)}
        {...selectProps}
      >
        {children}
      </select>
    </Field>
  );
}
