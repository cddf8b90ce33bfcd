import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DigestPreferenceDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { almanacKeys } from './almanac-keys';

export function getMorningEmail(signal?: AbortSignal): Promise<DigestPreferenceDto> {
  return apiFetch<DigestPreferenceDto>('/api/almanac/morning-email', { signal });
}

export function morningEmailQueryOptions() {
  return queryOptions({ queryKey: almanacKeys.morningEmail(), queryFn: ({ signal }) => getMorningEmail(signal) });
}

export function useMorningEmail() {
  return useQuery(morningEmailQueryOptions());
}
