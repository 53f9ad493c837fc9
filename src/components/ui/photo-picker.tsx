import { useEffect, useId, useMemo, useRef, type ReactNode } from 'react';
import { cn } from '#src/lib/cn';
import { FieldError } from './field';

export interface PhotoPickerProps {
  label: ReactNode;
  hint?: ReactNode;
  file: File | null;
  onChange: (file: File | null) => void;
  error?: string | undefined;
  disabled?: boolean;
}

/**
 * Chooses one photo: on a phone `capture="environment"` opens the back camera straight away,
 * elsewhere the file chooser. Shows a small preview of the chosen file and a way to clear it.
 */
export function PhotoPicker({ label, hint, file, onChange, error, disabled }: PhotoPickerProps) {
  const id = useId();
  const inputRef = useRef<HTMLInputElement>(null);
  const preview = useMemo(() => (file ? URL.createObjectURL(file) : null), [file]);
  useEffect(() => () => (preview ? URL.revokeObjectURL(preview) : undefined), [preview]);
  useEffect(() => {
    if (!file && inputRef.current) inputRef.current.value = '';
  }, [file]);

  return (
    <div className="grid gap-1.5">
      <label htmlFor={id} className="font-semibold text-loam-900">
        {label}
      </label>
      {hint ? <p className="text-sm text-loam-600">{hint}</p> : null}
      <div className="flex flex-wrap items-center gap-3">
        {preview ? (
          <img
            src={preview}
            alt=""
            className="size-16 shrink-0 rounded-lg border border-loam-200 object-cover"
          />
        ) : null}
        <input
          ref={inputRef}
          id={id}
          type="file"
          accept="image/*"
          capture="environment"
          disabled={disabled}
          aria-invalid={error ? true : undefined}
          onChange={(event) => onChange(event.target.files?.[0] ?? null)}
          className={cn(
            'min-w-0 max-w-full flex-1 text-base text-loam-800',
            'file:mr-3 file:min-h-11 file:cursor-pointer file:rounded-lg file:border file:border-loam-300 file:bg-white file:px-4 file:font-semibold file:text-loam-900 hover:file:bg-husk-100',
          )}
        />
        {file ? (
          <button
            type="button"
            disabled={disabled}
            onClick={() => onChange(null)}
            className="min-h-11 rounded-lg px-3 font-semibold text-moss-800 hover:bg-moss-50"
          >
            Remove photo
          </button>
        ) : null}
      </div>
      {error ? <FieldError>{error}</FieldError> : null}
    </div>
  );
}
