import { queryOptions, useQuery } from '@tanstack/react-query';
import type { GrowOutListDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { growOutKeys } from './grow-out-keys';

type Filters = { status: 'growing' | 'closed' | 'all'; readyBy?: string };

export function getGroups(filters: Filters, signal?: AbortSignal): Promise<GrowOutListDto> {
  const params = new URLSearchParams({ status: filters.status, ...(filters.readyBy ? { readyBy: filters.readyBy } : {}) });
  return apiFetch<GrowOutListDto>(`/api/grow-out/groups?${params.toString()}`, { signal });
}

export function groupsQueryOptions(filters: Filters) {
  return queryOptions({ queryKey: growOutKeys.list(filters), queryFn: ({ signal }) => getGroups(filters, signal) });
}

/** Keeps the previous answer on screen while a new "ready by" date loads. */
export function useGroups(filters: Filters) {
  return useQuery({ ...groupsQueryOptions(filters), placeholderData: (previous) => previous });
}
