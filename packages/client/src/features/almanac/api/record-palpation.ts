import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PalpationCreateInput, ServiceDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { almanacKeys } from './almanac-keys';

export function recordPalpation(serviceId: string, input: Partial<PalpationCreateInput>): Promise<ServiceDto> {
  return apiFetch<ServiceDto>(`/api/services/${encodeURIComponent(serviceId)}/palpations`, { method: 'POST', body: input });
}

/** A negative palpation closes the service and plans the rebreed; the answer is the service as it is now. */
export function useRecordPalpation(serviceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: Partial<PalpationCreateInput>) => recordPalpation(serviceId, input),
    onSuccess: async (service) => {
      queryClient.setQueryData(almanacKeys.service(serviceId), service);
      await queryClient.invalidateQueries({ queryKey: almanacKeys.all });
    },
  });
}
