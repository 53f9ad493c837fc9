import { useId, type ReactNode, type Ref, type TextareaHTMLAttributes } from 'react';
import { cn } from '#src/lib/cn';
import { controlClass, Field, fieldAria } from './field';

export interface TextAreaFieldProps extends TextareaHTMLAttributes<HTMLTextAreaElement> {
  label: ReactNode;
  hint?: ReactNode;
  error?: string | undefined;
  ref?: Ref<HTMLTextAreaElement>;
  containerClassName?: string;
}

/** A labelled multi-line box (notes), with a hint and an error like TextField. */
export function TextAreaField({
  label,
  hint,
  error,
  id,
  className,
  containerClassName,
  required,
  ref,
  rows = 3,
  'aria-describedby': describedBy,
  ...areaProps
}: TextAreaFieldProps) {
  const generatedId = useId();
  const areaId = id ?? generatedId;
  return (
    <Field
      id={areaId}
      label={label}
      hint={hint}
      error={error}
      required={required}
      className={containerClassName}
    >
      <textarea
        ref={ref}
        id={areaId}
        rows={rows}
        required={required}
        {...fieldAria(areaId, { hint, error, describedBy })}
        className={cn(controlClass(error), className)}
        {...areaProps}
      />
    </Field>
  );
}
