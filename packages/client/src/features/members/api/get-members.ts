import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { MemberListDto, MemberListView } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { memberKeys } from './member-keys';

export function getMembers(view: MemberListView, signal?: AbortSignal): Promise<MemberListDto> {
  const params = new URLSearchParams(Object.entries(view).map(([key, value]) => [key, String(value)]));
  return apiFetch<MemberListDto>(`/api/members?${params}`, { signal });
}

export function membersQueryOptions(view: MemberListView) {
  return queryOptions({ queryKey: memberKeys.list(view), queryFn: ({ signal }) => getMembers(view, signal) });
}

/** One page of the roster as the server filters, sorts and pages it; the last page stays while the next loads. */
export function useMembers(view: MemberListView) {
  return useQuery({ ...membersQueryOptions(view), placeholderData: keepPreviousData });
}
