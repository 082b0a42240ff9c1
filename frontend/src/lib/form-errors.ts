import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { isApiError } from './api-client';

/**
 * Puts the server's field errors (`{ fields: { email: "…" } }`) under the matching inputs and
 * returns the message for the form as a whole, shown above the submit button (an alert, so it
 * is announced). Fields the form does not show are appended to that message, so nothing is lost.
 */
export function applyServerErrors<T extends FieldValues>(error: unknown, setError: UseFormSetError<T>, formFields: ReadonlyArray<Path<T>>): string {
  if (!isApiError(error)) return error instanceof Error ? error.message : 'Something went wrong. Try again.';
  const leftover: string[] = [];
  for (const [field, message] of Object.entries(error.fields ?? {})) {
    if ((formFields as readonly string[]).includes(field)) setError(field as Path<T>, { type: 'server', message });
    else leftover.push(`${field}: ${message}`);
  }
  return leftover.length > 0 ? `${error.message} (${leftover.join('; ')})` : error.message;
}

/**
 * Like applyServerErrors, but when every field error found its input, the message for the form
 * is only a pointer to them ("Correct the fields marked above."), so the same words do not show
 * twice; anything not tied to a shown field still appears in full.
 */
export function applyServerErrorsInline<T extends FieldValues>(error: unknown, setError: UseFormSetError<T>, formFields: ReadonlyArray<Path<T>>): string {
  const message = applyServerErrors(error, setError, formFields);
  if (!isApiError(error) || !error.fields) return message;
  const allShown = Object.keys(error.fields).every((field) => (formFields as readonly string[]).includes(field));
  return allShown ? 'Correct the fields marked above.' : message;
}
