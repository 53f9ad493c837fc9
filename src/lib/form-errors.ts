import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { isApiError } from './api-client';

/**
 * Puts a failed request's message where it belongs: the server's per-field messages onto the
 * fields the form shows (react-hook-form's setError), everything else into one message for the
 * whole form, which is returned (undefined when every message found its field).
 */
export function applyServerError<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  fieldNames: ReadonlyArray<Path<T>>,
): string | undefined {
  if (!isApiError(error)) return 'Something went wrong. Try again.';
  const leftOver: string[] = [];
  let placed = 0;
  for (const [key, message] of Object.entries(error.fields ?? {})) {
    const field = fieldNames.find((name) => name === key);
    if (field) {
      setError(field, { type: 'server', message }, { shouldFocus: placed === 0 });
      placed += 1;
    } else {
      leftOver.push(message);
    }
  }
  if (placed > 0 && leftOver.length === 0) return undefined;
  if (leftOver.length > 0 && placed > 0) return leftOver.join(' ');
  return error.message;
}
