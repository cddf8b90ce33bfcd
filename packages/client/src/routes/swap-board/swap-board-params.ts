import { data, useParams, type Params } from 'react-router-dom';

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** A mistyped Swap Board address is a missing page, not a failing request. */
export function listingIdFrom(params: Params): string {
  const id = params.listingId;
  if (!id || !uuidPattern.test(id)) throw data('That page was not found', { status: 404 });
  return id;
}

export function useListingIdParam(): string {
  return useParams().listingId ?? '';
}
