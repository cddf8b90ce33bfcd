import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client';
import { applicationKeys } from './application-keys';

export function markApplicationViewed(applicationId: string): Promise<void> {
  return apiFetch<void>(`/api/applications/${encodeURIComponent(applicationId)}/views`, { method: 'POST' });
}

/** Opening an application takes it off this admin's unread count (other admins still see it as new). */
export function useMarkApplicationViewed() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: markApplicationViewed,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: applicationKeys.all }),
  });
}
