import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { TemperatureReadingCreateBody, TemperatureReadingDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { healthKeys } from './keys';

export function recordTemperature(input: TemperatureReadingCreateBody): Promise<TemperatureReadingDto> {
  return apiFetch<TemperatureReadingDto>('/api/temperature-readings', { method: 'POST', body: input });
}

export function useRecordTemperature() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: recordTemperature, onSuccess: () => queryClient.invalidateQueries({ queryKey: healthKeys.all }) });
}
