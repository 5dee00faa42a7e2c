import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { isApiError } from './api-client';

/**
 * Puts a failed request's error where the user will see it: each message the server gave for a
 * field of this form goes beside that field, and so does an error whose code belongs to one field
 * (`codeFields`, e.g. `{ 'email-taken': 'email' }`); anything else becomes the form's own message
 * (returned, for a `<FormError>`).
 */
export function showServerErrors<T extends FieldValues>(
  error: unknown,
  fieldNames: ReadonlyArray<Path<T>>,
  setError: UseFormSetError<T>,
  codeFields: Readonly<Record<string, Path<T>>> = {},
): string | null {
  if (!isApiError(error)) return error instanceof Error ? error.message : 'Something went wrong. Try again.';
  const codeField = codeFields[error.code];
  const fields = error.fields ?? (codeField ? { [codeField]: error.message } : {});
  let placed = 0;
  for (const [name, message] of Object.entries(fields)) {
    const field = fieldNames.find((f) => f === name);
    if (!field) continue;
    setError(field, { type: 'server', message }, { shouldFocus: placed === 0 });
    placed++;
  }
  return placed > 0 ? null : error.message;
}
