import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CoopRulesUpdateInput, CoopSettingsDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { auditKeys, coopKeys } from './member-keys';

/** Sends the version the edit started from; another admin's save in between answers 409 `stale_version`. */
export function updateCoopRules(input: CoopRulesUpdateInput): Promise<CoopSettingsDto> {
  return apiFetch<CoopSettingsDto>('/api/coop', { method: 'PATCH', body: input });
}

export function useUpdateCoopRules() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateCoopRules,
    onSuccess: (settings) => {
      queryClient.setQueryData(coopKeys.settings(), settings);
      void queryClient.invalidateQueries({ queryKey: auditKeys.all });
      void queryClient.invalidateQueries({ queryKey: ['public-coop'] });
    },
  });
}
