import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { LitterListDto, LitterListQuery } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { litterKeys } from './litter-keys';

export function getLitters(query: LitterListQuery, signal?: AbortSignal): Promise<LitterListDto> {
  const params = new URLSearchParams(Object.entries(query).filter(([, value]) => value !== undefined).map(([key, value]) => [key, String(value)]));
  return apiFetch<LitterListDto>(`/api/litters?${params}`, { signal });
}

export function littersQueryOptions(query: LitterListQuery) {
  return queryOptions({ queryKey: litterKeys.list(query), queryFn: ({ signal }) => getLitters(query, signal) });
}

/** One page of the farm's litters; the last page stays on screen (dimmed) while the next one loads. */
export function useLitters(query: LitterListQuery) {
  return useQuery({ ...littersQueryOptions(query), placeholderData: keepPreviousData });
}
