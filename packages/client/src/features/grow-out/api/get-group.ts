import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { GrowOutGroupDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { growOutKeys } from './grow-out-keys';

export function getGroup(groupId: string, signal?: AbortSignal): Promise<GrowOutGroupDto> {
  return apiFetch<GrowOutGroupDto>(`/api/grow-out/groups/${groupId}`, { signal });
}

export function groupQueryOptions(groupId: string) {
  return queryOptions({ queryKey: growOutKeys.detail(groupId), queryFn: ({ signal }) => getGroup(groupId, signal) });
}

export function useGroup(groupId: string) {
  return useSuspenseQuery(groupQueryOptions(groupId));
}
