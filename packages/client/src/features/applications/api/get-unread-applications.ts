import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client';
import { applicationKeys } from './application-keys';

export async function getUnreadApplications(signal?: AbortSignal): Promise<number> {
  return (await apiFetch<{ count: number }>('/api/applications/unread-count', { signal })).count;
}

export function unreadApplicationsQueryOptions() {
  return queryOptions({ queryKey: applicationKeys.unread(), queryFn: ({ signal }) => getUnreadApplications(signal) });
}

/** The navigation badge: pending applications this admin has not opened. Kept fresh by live events. */
export function useUnreadApplications(enabled: boolean) {
  return useQuery({ ...unreadApplicationsQueryOptions(), enabled });
}
