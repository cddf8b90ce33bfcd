import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { CycleSettingsDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { almanacKeys } from './almanac-keys';

export function getCycleSettings(signal?: AbortSignal): Promise<CycleSettingsDto> {
  return apiFetch<CycleSettingsDto>('/api/almanac/settings', { signal });
}

export function cycleSettingsQueryOptions() {
  return queryOptions({ queryKey: almanacKeys.settings(), queryFn: ({ signal }) => getCycleSettings(signal) });
}

export function useCycleSettings() {
  return useSuspenseQuery(cycleSettingsQueryOptions());
}
