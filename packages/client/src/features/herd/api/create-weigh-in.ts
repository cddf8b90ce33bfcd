import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { WeighInCreateInput, WeighInDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { herdKeys } from './herd-keys';

export function createWeighIn(body: Omit<WeighInCreateInput, 'headCount' | 'note'> & Partial<WeighInCreateInput>): Promise<WeighInDto> {
  return apiFetch<WeighInDto>('/api/weigh-ins', { method: 'POST', body });
}

export function useCreateWeighIn(animalId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createWeighIn,
    onSuccess: async () => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: herdKeys.weighIns(animalId) }),
        queryClient.invalidateQueries({ queryKey: herdKeys.detail(animalId) }),
      ]);
    },
  });
}
