import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ServiceListDto, ServiceListQuery } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { almanacKeys } from './almanac-keys';

export function getServices(query: ServiceListQuery, signal?: AbortSignal): Promise<ServiceListDto> {
  const params = new URLSearchParams(Object.entries(query).flatMap(([key, value]) => (value === undefined ? [] : [[key, String(value)]])));
  return apiFetch<ServiceListDto>(`/api/services?${params}`, { signal });
}

export function servicesQueryOptions(query: ServiceListQuery) {
  return queryOptions({ queryKey: almanacKeys.services(query), queryFn: ({ signal }) => getServices(query, signal) });
}

/** One page of the farm's services; the last page stays on screen while the next one loads. */
export function useServices(query: ServiceListQuery) {
  return useQuery({ ...servicesQueryOptions(query), placeholderData: keepPreviousData });
}
