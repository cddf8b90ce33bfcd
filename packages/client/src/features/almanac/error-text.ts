import { isApiError } from '../../lib/api-client';

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
