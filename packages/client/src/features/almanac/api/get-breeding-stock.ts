import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { BreedingStockListDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { almanacKeys } from './almanac-keys';

export function getBreedingStock(signal?: AbortSignal): Promise<BreedingStockListDto> {
  return apiFetch<BreedingStockListDto>('/api/almanac/breeding-stock', { signal });
}

export function breedingStockQueryOptions() {
  return queryOptions({ queryKey: almanacKeys.breedingStock(), queryFn: ({ signal }) => getBreedingStock(signal) });
}

/** The farm's does and bucks for the service form, with what it must warn about. */
export function useBreedingStock() {
  return useSuspenseQuery(breedingStockQueryOptions());
}
