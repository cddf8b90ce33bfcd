import { data, useParams, type Params } from 'react-router-dom';

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** A mistyped Stud Share address is a missing page, not a failing request. */
export function idFrom(params: Params, name: 'offerId' | 'loanId' | 'damId'): string {
  const id = params[name];
  if (!id || !uuidPattern.test(id)) throw data('That page was not found', { status: 404 });
  return id;
}

export function useIdParam(name: 'offerId' | 'loanId' | 'damId'): string {
  return useParams()[name] ?? '';
}
