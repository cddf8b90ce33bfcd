import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AnimalPhotosDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { photoKeys } from './photo-keys';

export function getAnimalPhotos(animalId: string, signal?: AbortSignal): Promise<AnimalPhotosDto> {
  return apiFetch<AnimalPhotosDto>(`/api/animals/${encodeURIComponent(animalId)}/photos`, { signal });
}

export function animalPhotosQueryOptions(animalId: string) {
  return queryOptions({ queryKey: photoKeys.animal(animalId), queryFn: ({ signal }) => getAnimalPhotos(animalId, signal) });
}

export function useAnimalPhotos(animalId: string) {
  return useQuery(animalPhotosQueryOptions(animalId));
}
