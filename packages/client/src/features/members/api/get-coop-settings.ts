import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { CoopSettingsDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { coopKeys } from './member-keys';

export function getCoopSettings(signal?: AbortSignal): Promise<CoopSettingsDto> {
  return apiFetch<CoopSettingsDto>('/api/coop', { signal });
}

export function coopSettingsQueryOptions() {
  return queryOptions({ queryKey: coopKeys.settings(), queryFn: ({ signal }) => getCoopSettings(signal) });
}

export function useCoopSettings() {
  return useSuspenseQuery(coopSettingsQueryOptions());
}
