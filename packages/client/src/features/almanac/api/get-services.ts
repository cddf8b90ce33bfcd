import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { ServiceListItemDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { almanacKeys } from './almanac-keys';

export function getServices(filters: { status?: 'open' | 'closed' | 'all' }, signal?: AbortSignal): Promise<{ services: ServiceListItemDto[] }> {
  const query = filters.status ? `?status=${filters.status}` : '';
  return apiFetch<{ services: ServiceListItemDto[] }>(`/api/services${query}`, { signal });
}

export function servicesQueryOptions(filters: { status?: 'open' | 'closed' | 'all' }) {
  return queryOptions({ queryKey: almanacKeys.services(filters), queryFn: ({ signal }) => getServices(filters, signal) });
}

export function useServices(filters: { status?: 'open' | 'closed' | 'all' }) {
  return useSuspenseQuery(servicesQueryOptions(filters));
}
