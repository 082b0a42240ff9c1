import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { isApiError } from './api-client';

/**
 * Puts the server's field errors (`{ fields: { email: "…" } }`) under the matching inputs and
 * returns the message for the form as a whole, shown above the submit button (an alert, so it
 * is announced). Fields the form does not show are appended to that message, so nothing is lost.
 */
export function applyServerErrors<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  formFields: ReadonlyArray<Path<T>>,
): string {
  if (!isApiError(error)) return error instanceof Error ? error.message : 'Something went wrong. Try again.';
  const leftover: string[] = [];
  for (const [field, message] of Object.entries(error.fields ?? {})) {
    if ((formFields as readonly string[]).includes(field)) setError(field as Path<T>, { type: 'server', message });
    else leftover.push(`${field}: ${message}`);
  }
  return leftover.length > 0 ? `${error.message} (${leftover.join('; ')})` : error.message;
}
