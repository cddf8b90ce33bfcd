import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { AnimalListDto, AnimalListQuery } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { herdKeys } from './herd-keys';

export function getHerd(query: AnimalListQuery, signal?: AbortSignal): Promise<AnimalListDto> {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) if (value !== undefined && value !== '') params.set(key, String(value));
  return apiFetch<AnimalListDto>(`/api/animals?${params}`, { signal });
}

export function herdQueryOptions(query: AnimalListQuery) {
  return queryOptions({ queryKey: herdKeys.list(query), queryFn: ({ signal }) => getHerd(query, signal) });
}

/** The farm's herd; while new filters load, the previous rows stay (dimmed) instead of a blank screen. */
export function useHerd(query: AnimalListQuery) {
  return useQuery({ ...herdQueryOptions(query), placeholderData: keepPreviousData });
}
