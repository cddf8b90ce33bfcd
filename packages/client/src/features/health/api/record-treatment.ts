import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { TreatmentCreateBody, TreatmentDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { healthKeys } from './keys';

export function recordTreatment(input: TreatmentCreateBody): Promise<TreatmentDto> {
  return apiFetch<TreatmentDto>('/api/treatments', { method: 'POST', body: input });
}

/** A treatment flags the doe on the service form and blocks processing until its withdrawal is over. */
export function useRecordTreatment() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: recordTreatment,
    onSuccess: async () => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: healthKeys.all }),
        queryClient.invalidateQueries({ queryKey: ['almanac'] }),
        queryClient.invalidateQueries({ queryKey: ['processing'] }),
      ]);
    },
  });
}
