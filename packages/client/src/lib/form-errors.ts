import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { ErrorCode } from '@burrowline/shared';
import { isApiError } from './api-client';

/** Which form field a server or schema path ("farm.name", "count") belongs to; null when none. */
export type FieldOf<T extends FieldValues> = (path: string) => Path<T> | null;

/** The form's field names, as a lookup that also matches nested paths under them ("breedsKept.2"). */
export function fieldsNamed<T extends FieldValues>(fields: readonly Path<T>[]): FieldOf<T> {
  return (path) => fields.find((name) => path === name || path.startsWith(`${name}.`)) ?? null;
}

/**
 * Puts the server's field messages (`details`, keyed by dotted path) under the matching inputs and
 * focuses the first. Returns false when none matched, so the caller shows the general message instead.
 * Warnings of a 422 are not field errors: the breeder may save anyway (see `confirmWarnings`).
 */
export function applyServerFieldErrors<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  fields: readonly Path<T>[] | FieldOf<T>,
): boolean {
  if (!isApiError(error) || error.code === ErrorCode.confirmationRequired) return false;
  const fieldOf = typeof fields === 'function' ? fields : fieldsNamed(fields);
  let matched = 0;
  for (const [key, messages] of Object.entries(error.details)) {
    const field = fieldOf(key);
    const message = messages[0];
    if (!field || !message) continue;
    setError(field, { type: 'server', message }, { shouldFocus: matched === 0 });
    matched += 1;
  }
  return matched > 0;
}

/** The warnings of a 422 `confirmation_required` (a young doe, a date outside the window), else null. */
export function confirmWarnings(error: unknown): string[] | null {
  if (!isApiError(error, ErrorCode.confirmationRequired)) return null;
  const warnings = Object.values(error.details).flat();
  return warnings.length > 0 ? warnings : [error.message];
}

/** The message to show for a failed save: the server's first field message when it gave one. */
export function errorText(error: unknown): string {
  if (isApiError(error)) {
    const first = Object.values(error.details)[0]?.[0];
    return first ?? error.message;
  }
  return error instanceof Error ? error.message : 'Something went wrong';
}
