import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ServiceClosureInput, ServiceDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { almanacKeys } from './almanac-keys';

export function closeService(serviceId: string, input: ServiceClosureInput): Promise<ServiceDto> {
  return apiFetch<ServiceDto>(`/api/services/${encodeURIComponent(serviceId)}/closure`, { method: 'POST', body: input });
}

/** Closes a service as missed (no kindling): its open tasks are skipped and the rebreed planned. */
export function useCloseService(serviceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ServiceClosureInput) => closeService(serviceId, input),
    onSuccess: async (service) => {
      queryClient.setQueryData(almanacKeys.service(serviceId), service);
      await queryClient.invalidateQueries({ queryKey: almanacKeys.all });
    },
  });
}
