import { data, useParams, type Params } from 'react-router-dom';
import { uuidParamSchema } from '@burrowline/shared';

/** A route's id parameter, checked: a malformed one is a 404 page rather than a failed request. */
export function idFrom(params: Params, name: string): string {
  const parsed = uuidParamSchema.safeParse(params[name]);
  if (!parsed.success) throw data('That record was not found', { status: 404 });
  return parsed.data;
}

export function useIdParam(name: string): string {
  return idFrom(useParams(), name);
}
