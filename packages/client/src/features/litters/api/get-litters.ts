import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { LitterListItemDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { litterKeys } from './litter-keys';

export function getLitters(filters: { status?: 'nursing' | 'weaned' | 'all' }, signal?: AbortSignal): Promise<{ litters: LitterListItemDto[] }> {
  const query = filters.status ? `?status=${filters.status}` : '';
  return apiFetch<{ litters: LitterListItemDto[] }>(`/api/litters${query}`, { signal });
}

export function littersQueryOptions(filters: { status?: 'nursing' | 'weaned' | 'all' }) {
  return queryOptions({ queryKey: litterKeys.list(filters), queryFn: ({ signal }) => getLitters(filters, signal) });
}

export function useLitters(filters: { status?: 'nursing' | 'weaned' | 'all' }) {
  return useSuspenseQuery(littersQueryOptions(filters));
}
