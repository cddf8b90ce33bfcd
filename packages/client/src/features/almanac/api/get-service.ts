import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { ServiceDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { almanacKeys } from './almanac-keys';

export function getService(serviceId: string, signal?: AbortSignal): Promise<ServiceDto> {
  return apiFetch<ServiceDto>(`/api/services/${encodeURIComponent(serviceId)}`, { signal });
}

export function serviceQueryOptions(serviceId: string) {
  return queryOptions({ queryKey: almanacKeys.service(serviceId), queryFn: ({ signal }) => getService(serviceId, signal) });
}

export function useService(serviceId: string) {
  return useSuspenseQuery(serviceQueryOptions(serviceId));
}
