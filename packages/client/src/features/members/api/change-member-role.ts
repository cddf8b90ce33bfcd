import type { MemberDto, MemberRoleChangeInput } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { useMemberMutation } from './member-mutation';

/** Ends the person's sessions: they sign in again with the new role. */
export function changeMemberRole(userId: string, input: MemberRoleChangeInput): Promise<MemberDto> {
  return apiFetch<MemberDto>(`/api/members/${encodeURIComponent(userId)}/role`, { method: 'PATCH', body: input });
}

export function useChangeMemberRole(userId: string) {
  return useMemberMutation(userId, (input: MemberRoleChangeInput) => changeMemberRole(userId, input));
}
