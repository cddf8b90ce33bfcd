import { data, useParams, type Params } from 'react-router-dom';

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** A mistyped animal address is a missing page, not a failing request. */
export function animalIdFrom(params: Params): string {
  const animalId = params.animalId;
  if (!animalId || !uuidPattern.test(animalId)) throw data('That animal was not found', { status: 404 });
  return animalId;
}

export function useAnimalIdParam(): string {
  return useParams().animalId ?? '';
}
