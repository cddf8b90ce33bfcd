import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ServiceCreateBody, ServiceDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { almanacKeys } from './almanac-keys';

/** 422 `confirmation_required` carries the warnings (young doe, under treatment); resend with `confirm: true`. */
export function recordService(input: ServiceCreateBody): Promise<ServiceDto> {
  return apiFetch<ServiceDto>('/api/services', { method: 'POST', body: input });
}

export function useRecordService() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: recordService,
    onSuccess: async (service) => {
      queryClient.setQueryData(almanacKeys.service(service.id), service);
      await queryClient.invalidateQueries({ queryKey: almanacKeys.all });
    },
  });
}
