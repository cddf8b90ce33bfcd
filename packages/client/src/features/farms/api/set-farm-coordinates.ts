import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { FarmCoordinatesInput } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { farmKeys } from './farm-keys';

/** The farm's optional coordinates (distances in Stud Share's finder) and whether its litters count in sires' records. */
export function useSetFarmCoordinates(farmId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: FarmCoordinatesInput) => apiFetch<unknown>(`/api/farms/${encodeURIComponent(farmId)}/coordinates`, { method: 'PUT', body: input }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: farmKeys.all }),
  });
}
