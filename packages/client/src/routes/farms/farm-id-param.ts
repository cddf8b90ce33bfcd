import { data, useParams, type Params } from 'react-router-dom';

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** A mistyped farm address is a missing page, not a server round trip that fails validation. */
export function farmIdFrom(params: Params): string {
  const farmId = params.farmId;
  if (!farmId || !uuidPattern.test(farmId)) throw data('That farm was not found', { status: 404 });
  return farmId;
}

/** The loader has already checked the id, so the page can take it as given. */
export function useFarmIdParam(): string {
  return useParams().farmId ?? '';
}
