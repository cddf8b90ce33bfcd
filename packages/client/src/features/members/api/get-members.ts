import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { MemberDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { memberKeys } from './member-keys';

export async function getMembers(signal?: AbortSignal): Promise<MemberDto[]> {
  return (await apiFetch<{ members: MemberDto[] }>('/api/members', { signal })).members;
}

export function membersQueryOptions() {
  return queryOptions({ queryKey: memberKeys.list(), queryFn: ({ signal }) => getMembers(signal) });
}

/** The whole roster (a co-op is tens of people): the table sorts, filters and pages it in the browser. */
export function useMembers() {
  return useSuspenseQuery(membersQueryOptions());
}
