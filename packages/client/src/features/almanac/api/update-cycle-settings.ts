import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CycleSettingsPatchInput, CycleSettingsSaveDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { litterKeys } from '../../litters';
import { almanacKeys } from './almanac-keys';

/** Sends the version edited from; the answer says how many open tasks were re-planned. */
export function updateCycleSettings(input: CycleSettingsPatchInput): Promise<CycleSettingsSaveDto> {
  return apiFetch<CycleSettingsSaveDto>('/api/almanac/settings', { method: 'PATCH', body: input });
}

export function useUpdateCycleSettings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateCycleSettings,
    onSuccess: async (saved) => {
      queryClient.setQueryData(almanacKeys.settings(), saved);
      await queryClient.invalidateQueries({ queryKey: almanacKeys.all });
      await queryClient.invalidateQueries({ queryKey: litterKeys.all });
    },
  });
}
