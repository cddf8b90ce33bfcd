import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ApplicationDto, ApplicationRejectionInput } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { applicationKeys } from './application-keys';

export function rejectApplication(applicationId: string, input: ApplicationRejectionInput): Promise<ApplicationDto> {
  return apiFetch<ApplicationDto>(`/api/applications/${encodeURIComponent(applicationId)}/rejection`, { method: 'POST', body: input });
}

export function useRejectApplication(applicationId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ApplicationRejectionInput) => rejectApplication(applicationId, input),
    onSuccess: (application) => {
      queryClient.setQueryData(applicationKeys.detail(applicationId), application);
      void queryClient.invalidateQueries({ queryKey: applicationKeys.all });
    },
    onError: () => void queryClient.invalidateQueries({ queryKey: applicationKeys.detail(applicationId) }),
  });
}
