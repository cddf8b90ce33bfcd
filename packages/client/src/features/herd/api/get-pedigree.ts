import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PedigreeTreeDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { herdKeys } from './herd-keys';

export function getPedigree(animalId: string, generations: number, signal?: AbortSignal): Promise<PedigreeTreeDto> {
  return apiFetch<PedigreeTreeDto>(`/api/animals/${encodeURIComponent(animalId)}/pedigree?generations=${generations}`, { signal });
}

export function pedigreeQueryOptions(animalId: string, generations = 4) {
  return queryOptions({ queryKey: herdKeys.pedigree(animalId, generations), queryFn: ({ signal }) => getPedigree(animalId, generations, signal) });
}

export function usePedigree(animalId: string, generations = 4) {
  return useQuery(pedigreeQueryOptions(animalId, generations));
}
