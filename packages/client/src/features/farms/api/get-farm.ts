import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { FarmDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { farmKeys } from './farm-keys';

export function getFarm(farmId: string, signal?: AbortSignal): Promise<FarmDto> {
  return apiFetch<FarmDto>(`/api/farms/${encodeURIComponent(farmId)}`, { signal });
}

export function farmDetailQueryOptions(farmId: string) {
  return queryOptions({ queryKey: farmKeys.detail(farmId), queryFn: ({ signal }) => getFarm(farmId, signal) });
}

export function useFarm(farmId: string) {
  return useSuspenseQuery(farmDetailQueryOptions(farmId));
}
