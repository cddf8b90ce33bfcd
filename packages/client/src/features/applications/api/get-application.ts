import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { ApplicationDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { applicationKeys } from './application-keys';

export function getApplication(applicationId: string, signal?: AbortSignal): Promise<ApplicationDto> {
  return apiFetch<ApplicationDto>(`/api/applications/${encodeURIComponent(applicationId)}`, { signal });
}

export function applicationQueryOptions(applicationId: string) {
  return queryOptions({ queryKey: applicationKeys.detail(applicationId), queryFn: ({ signal }) => getApplication(applicationId, signal) });
}

export function useApplication(applicationId: string) {
  return useSuspenseQuery(applicationQueryOptions(applicationId));
}
