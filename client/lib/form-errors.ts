import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { isApiError } from './api-client';

/**
 * Puts a failed request's error where the user will see it: each message the server gave for a
 * field of this form goes beside that field; anything else becomes the form's own message
 * (returned, for a `<FormError>`).
 */
export function showServerErrors<T extends FieldValues>(
  error: unknown,
  fieldNames: ReadonlyArray<Path<T>>,
  setError: UseFormSetError<T>,
): string | null {
  if (!isApiError(error)) return error instanceof Error ? error.message : 'Something went wrong. Try again.';
  let placed = 0;
  for (const [name, message] of Object.entries(error.fields ?? {})) {
    const field = fieldNames.find((f) => f === name);
    if (!field) continue;
    setError(field, { type: 'server', message }, { shouldFocus: placed === 0 });
    placed++;
  }
  return placed > 0 ? null : error.message;
}
