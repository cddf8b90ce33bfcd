import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ApplicationListDto, ApplicationListQuery } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { applicationKeys } from './application-keys';

export function getApplications(query: ApplicationListQuery, signal?: AbortSignal): Promise<ApplicationListDto> {
  const params = new URLSearchParams(Object.entries(query).map(([key, value]) => [key, String(value)]));
  return apiFetch<ApplicationListDto>(`/api/applications?${params}`, { signal });
}

export function applicationsQueryOptions(query: ApplicationListQuery) {
  return queryOptions({ queryKey: applicationKeys.list(query), queryFn: ({ signal }) => getApplications(query, signal) });
}

/** The queue for the current filters; the last page stays on screen while the next one loads. */
export function useApplications(query: ApplicationListQuery) {
  return useQuery({ ...applicationsQueryOptions(query), placeholderData: keepPreviousData });
}
