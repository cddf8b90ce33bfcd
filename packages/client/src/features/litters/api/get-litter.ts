import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { LitterDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { litterKeys } from './litter-keys';

export function getLitter(litterId: string, signal?: AbortSignal): Promise<LitterDto> {
  return apiFetch<LitterDto>(`/api/litters/${encodeURIComponent(litterId)}`, { signal });
}

export function litterQueryOptions(litterId: string) {
  return queryOptions({ queryKey: litterKeys.detail(litterId), queryFn: ({ signal }) => getLitter(litterId, signal) });
}

export function useLitter(litterId: string) {
  return useSuspenseQuery(litterQueryOptions(litterId));
}
