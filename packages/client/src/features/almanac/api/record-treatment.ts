import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { TreatmentCreateInput, TreatmentDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { almanacKeys } from './almanac-keys';

export function recordTreatment(input: TreatmentCreateInput): Promise<TreatmentDto> {
  return apiFetch<TreatmentDto>('/api/treatments', { method: 'POST', body: input });
}

/** A treatment flags the doe on the service form until the withdrawal the veterinarian set is over. */
export function useRecordTreatment() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: recordTreatment, onSuccess: () => queryClient.invalidateQueries({ queryKey: almanacKeys.all }) });
}
