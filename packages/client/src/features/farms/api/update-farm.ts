import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { FarmDto, FarmProfileUpdateInput } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { farmKeys } from './farm-keys';

/** Sends the version the edit started from; the server answers 409 `stale_version` if someone saved since. */
export function updateFarm(farmId: string, input: FarmProfileUpdateInput): Promise<FarmDto> {
  return apiFetch<FarmDto>(`/api/farms/${encodeURIComponent(farmId)}`, { method: 'PATCH', body: input });
}

export function useUpdateFarm(farmId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: FarmProfileUpdateInput) => updateFarm(farmId, input),
    onSuccess: async (farm) => {
      queryClient.setQueryData(farmKeys.detail(farmId), farm);
      await queryClient.invalidateQueries({ queryKey: farmKeys.list() });
    },
  });
}
