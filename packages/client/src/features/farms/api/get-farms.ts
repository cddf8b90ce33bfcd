import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { FarmDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { farmKeys } from './farm-keys';

export async function getFarms(signal?: AbortSignal): Promise<FarmDto[]> {
  const { farms } = await apiFetch<{ farms: FarmDto[] }>('/api/farms', { signal });
  return farms;
}

export function farmsListQueryOptions() {
  return queryOptions({ queryKey: farmKeys.list(), queryFn: ({ signal }) => getFarms(signal) });
}

/** The co-op's directory; the route loader has already fetched it, so this never suspends on first render. */
export function useFarms() {
  return useSuspenseQuery(farmsListQueryOptions());
}
