import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AnimalDetailDto, PedigreeCardDto } from '@burrowline/shared';
import { apiFetch, isApiError } from '../../../lib/api-client';
import { herdKeys } from './herd-keys';

export function getAnimal(animalId: string, signal?: AbortSignal): Promise<AnimalDetailDto> {
  return apiFetch<AnimalDetailDto>(`/api/animals/${encodeURIComponent(animalId)}`, { signal });
}

export function getPedigreeCard(animalId: string, signal?: AbortSignal): Promise<PedigreeCardDto> {
  return apiFetch<PedigreeCardDto>(`/api/pedigree-cards/${encodeURIComponent(animalId)}`, { signal });
}

/**
 * An animal as the signed-in person may see it: the full record for its own farm, otherwise its
 * pedigree card (another farm's animal, or an outside one known from papers).
 */
export type AnimalView = { kind: 'record'; animal: AnimalDetailDto } | { kind: 'card'; card: PedigreeCardDto };

export async function getAnimalView(animalId: string, signal?: AbortSignal): Promise<AnimalView> {
  try {
    return { kind: 'record', animal: await getAnimal(animalId, signal) };
  } catch (error) {
    if (isApiError(error) && (error.status === 403 || error.status === 404)) {
      return { kind: 'card', card: await getPedigreeCard(animalId, signal) };
    }
    throw error;
  }
}

export function animalViewQueryOptions(animalId: string) {
  return queryOptions({ queryKey: herdKeys.detail(animalId), queryFn: ({ signal }) => getAnimalView(animalId, signal) });
}

export function useAnimalView(animalId: string) {
  return useQuery(animalViewQueryOptions(animalId));
}
