import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { MemberDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { memberKeys } from './member-keys';

export function getMember(userId: string, signal?: AbortSignal): Promise<MemberDto> {
  return apiFetch<MemberDto>(`/api/members/${encodeURIComponent(userId)}`, { signal });
}

export function memberQueryOptions(userId: string) {
  return queryOptions({ queryKey: memberKeys.detail(userId), queryFn: ({ signal }) => getMember(userId, signal) });
}

export function useMember(userId: string) {
  return useSuspenseQuery(memberQueryOptions(userId));
}
