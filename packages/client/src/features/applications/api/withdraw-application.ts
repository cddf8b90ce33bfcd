import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ApplicationDto, ApplicationWithdrawalInput } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { applicationKeys } from './application-keys';

export function withdrawApplication(applicationId: string, input: ApplicationWithdrawalInput): Promise<ApplicationDto> {
  return apiFetch<ApplicationDto>(`/api/applications/${encodeURIComponent(applicationId)}/withdrawal`, { method: 'POST', body: input });
}

export function useWithdrawApplication(applicationId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ApplicationWithdrawalInput) => withdrawApplication(applicationId, input),
    onSuccess: (application) => {
      queryClient.setQueryData(applicationKeys.detail(applicationId), application);
      void queryClient.invalidateQueries({ queryKey: applicationKeys.all });
    },
    onError: () => void queryClient.invalidateQueries({ queryKey: applicationKeys.detail(applicationId) }),
  });
}
