import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { isApiError } from './api-client';

/**
 * Puts the server's field messages (`details`, keyed by dotted path) under the matching inputs and
 * focuses the first. Returns false when none matched, so the caller shows the general message instead.
 */
export function applyServerFieldErrors<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  fields: readonly Path<T>[],
): boolean {
  if (!isApiError(error)) return false;
  let matched = 0;
  for (const [key, messages] of Object.entries(error.details)) {
    const field = fields.find((name) => key === name || key.startsWith(`${name}.`));
    const message = messages[0];
    if (!field || !message) continue;
    setError(field, { type: 'server', message }, { shouldFocus: matched === 0 });
    matched += 1;
  }
  return matched > 0;
}

/** The message to show for a failed save: the server's first field message when it gave one. */
export function errorText(error: unknown): string {
  if (isApiError(error)) {
    const first = Object.values(error.details)[0]?.[0];
    return first ?? error.message;
  }
  return error instanceof Error ? error.message : 'Something went wrong';
}

/** Field messages of a failed save, by field name (empty when there are none). */
export function fieldErrors(error: unknown): Record<string, string | undefined> {
  if (!isApiError(error)) return {};
  return Object.fromEntries(Object.entries(error.details).map(([k, v]) => [k, v[0]]));
}
