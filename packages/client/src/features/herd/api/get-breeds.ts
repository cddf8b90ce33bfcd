import { queryOptions, useQuery } from '@tanstack/react-query';
import type { BreedDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { herdKeys } from './herd-keys';

export async function getBreeds(signal?: AbortSignal): Promise<BreedDto[]> {
  return (await apiFetch<{ breeds: BreedDto[] }>('/api/breeds', { signal })).breeds;
}

/** The catalogue changes only when an admin adds a breed. */
export function breedsQueryOptions() {
  return queryOptions({ queryKey: herdKeys.breeds(), queryFn: ({ signal }) => getBreeds(signal), staleTime: 10 * 60_000 });
}

export function useBreeds() {
  return useQuery(breedsQueryOptions());
}
