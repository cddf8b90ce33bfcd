import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PerformanceDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { performanceKeys, type PerformanceFilters } from './performance-keys';

export type { PerformanceFilters };

export function getPerformance(filters: PerformanceFilters, signal?: AbortSignal): Promise<PerformanceDto> {
  const params = new URLSearchParams({ period: filters.period });
  if (filters.period === 'custom' && filters.from && filters.to) {
    params.set('from', filters.from);
    params.set('to', filters.to);
  }
  return apiFetch<PerformanceDto>(`/api/performance?${params.toString()}`, { signal });
}

export function performanceQueryOptions(filters: PerformanceFilters) {
  return queryOptions({ queryKey: performanceKeys.tables(filters), queryFn: ({ signal }) => getPerformance(filters, signal) });
}

/** Keeps the previous tables on screen while another period loads. */
export function usePerformance(filters: PerformanceFilters) {
  return useQuery({ ...performanceQueryOptions(filters), placeholderData: (previous) => previous });
}
