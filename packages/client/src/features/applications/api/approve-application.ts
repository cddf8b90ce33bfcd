import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ApplicationApprovalInput, ApplicationDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { applicationKeys } from './application-keys';

export function approveApplication(applicationId: string, input: ApplicationApprovalInput): Promise<ApplicationDto> {
  return apiFetch<ApplicationDto>(`/api/applications/${encodeURIComponent(applicationId)}/approval`, { method: 'POST', body: input });
}

export function useApproveApplication(applicationId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ApplicationApprovalInput) => approveApplication(applicationId, input),
    onSuccess: (application) => {
      queryClient.setQueryData(applicationKeys.detail(applicationId), application);
      void queryClient.invalidateQueries({ queryKey: applicationKeys.all });
      void queryClient.invalidateQueries({ queryKey: ['farms'] });
      void queryClient.invalidateQueries({ queryKey: ['members'] });
    },
    // Another admin decided first: show their decision.
    onError: () => void queryClient.invalidateQueries({ queryKey: applicationKeys.detail(applicationId) }),
  });
}
